import type { Metadata } from "next";
import { env } from "@/env";
import { Panel } from "@/components/ui/panel";
import { listCaughtMessages } from "@/server/mail/store";
import { notFound } from "next/navigation";
import { requireUser } from "@/server/context";
import { isMailOperator } from "@/server/mail/operators";

export const metadata: Metadata = { title: "Caught mail" };

const TIME = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "medium", timeZone: "UTC" });

/** Splits plain text so that web addresses become links (sign-in links, links to maps). */
function Linked({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"]+)/g);
  return (
    <>
      {parts.map((part, i) =>
        i % 2 === 1 ? (
          <a key={i} href={part} className="break-all text-tide-700 underline underline-offset-2">
            {part}
          </a>
        ) : (
          part
        ),
      )}
    </>
  );
}

export default async function CaughtMailPage() {
  // Operators only (MAIL_OPERATORS), never a workspace role: to anyone else the page does not exist.
  const user = await requireUser();
  if (!isMailOperator(user.email)) notFound();
  const messages = await listCaughtMessages(env.MAIL_CATCHER_DIR, { limit: 50 });
  return (
    <div className="mx-auto max-w-4xl space-y-6 px-5 py-8">
      <div>
        <h1 className="text-3xl font-semibold tracking-tight text-tide-900">Caught mail</h1>
        <p className="mt-2 text-sm text-ink-soft">
          The local SMTP catcher on <span className="font-mono">127.0.0.1:{env.SMTP_PORT}</span> keeps every message the app sends instead of
              delivering it. Newest first; operators only (MAIL_OPERATORS).
        </p>
      </div>
      {messages.length === 0 ? <Panel>No messages caught yet.</Panel> : null}
      <ol className="space-y-4">
        {messages.map((m) => (
          <li key={m.id}>
            <Panel>
              <article aria-label={m.subject}>
                <header className="flex flex-wrap items-baseline justify-between gap-2 border-b border-line pb-3">
                  <h2 className="text-base font-semibold text-tide-900">{m.subject || "(no subject)"}</h2>
                  <time dateTime={m.receivedAt} className="text-xs text-ink-faint">
                    {TIME.format(new Date(m.receivedAt))} UTC
                  </time>
                </header>
                <dl className="mt-3 grid grid-cols-[4rem_1fr] gap-y-1 text-sm">
                  <dt className="text-ink-faint">From</dt>
                  <dd className="font-mono text-xs leading-5">{m.from}</dd>
                  <dt className="text-ink-faint">To</dt>
                  <dd className="font-mono text-xs leading-5">{m.to.join(", ")}</dd>
                </dl>
                <pre className="mt-4 whitespace-pre-wrap rounded-md bg-paper p-4 font-mono text-[13px] leading-relaxed text-ink">
                  <Linked text={m.text} />
                </pre>
              </article>
            </Panel>
          </li>
        ))}
      </ol>
    </div>
  );
}
