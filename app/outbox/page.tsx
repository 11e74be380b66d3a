import type { Metadata } from "next";
import Link from "next/link";
import { RowAction } from "@/components/team/row-action";
import { Panel } from "@/components/ui/panel";
import { listOutboxMessages } from "@/db/queries/outbox";
import { OUTBOX_STATUSES } from "@/db/schema";
import { requireAction } from "@/server/context";
import { resendMessageAction } from "./actions";

export const metadata: Metadata = { title: "Outbox" };

const TONE = { pending: "bg-saffron-100 text-saffron-700", sent: "bg-moss-50 text-moss-700", failed: "bg-brick-50 text-brick-700" } as const;

function when(d: Date | null): string {
  return d ? d.toISOString().slice(0, 16).replace("T", " ") + " UTC" : "—";
}

/** The workspace's own outbox rows and their delivery state (never the catcher's raw mail). */
export default async function OutboxPage({ searchParams }: { searchParams: Promise<{ status?: string }> }) {
  const { workspace } = await requireAction("outbox:manage");
  const raw = (await searchParams).status;
  const status = OUTBOX_STATUSES.find((s) => s === raw);
  const rows = await listOutboxMessages({ workspaceId: workspace.id, status, limit: 100 });
  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <div>
        <p className="text-sm text-ink-soft">{workspace.name}</p>
        <h1 className="mt-1 text-3xl font-semibold tracking-tight text-tide-900">Outbox</h1>
        <p className="mt-2 max-w-3xl text-sm text-ink-soft">
          Mail this workspace sent or is sending. A refused message is retried with growing waits (1 minute doubling to 1 hour) for at least 24 hours before it is marked failed; you can send a failed one again.
        </p>
      </div>
      <nav aria-label="Filter by state" className="flex gap-2 text-sm">
        {[undefined, ...OUTBOX_STATUSES].map((s) => (
          <Link key={s ?? "all"} href={s ? `/outbox?status=${s}` : "/outbox"} aria-current={s === status ? "page" : undefined} className={`rounded-md px-2.5 py-1 ${s === status ? "bg-tide-700 text-paper-raised" : "text-tide-700 ring-1 ring-inset ring-line-strong"}`}>
            {s ?? "all"}
          </Link>
        ))}
      </nav>
      <Panel>
        {rows.length === 0 ? (
          <p className="text-sm text-ink-soft">No messages{status ? ` in state ${status}` : ""}.</p>
        ) : (
          <ul className="divide-y divide-line">
            {rows.map((m) => (
              <li key={m.id} className="flex flex-wrap items-start justify-between gap-3 py-3">
                <span className="min-w-0 space-y-0.5">
                  <span className="flex items-center gap-2">
                    <span className={`rounded-full px-2 py-0.5 text-xs font-semibold ${TONE[m.status]}`}>{m.status}</span>
                    <span className="truncate text-sm font-medium">{m.subject}</span>
                  </span>
                  <span className="block text-xs text-ink-faint">
                    to {m.toAddress} · queued {when(m.createdAt)} · {m.attempts} attempt{m.attempts === 1 ? "" : "s"}
                    {m.status === "sent" ? ` · sent ${when(m.sentAt)}` : ""}
                    {m.status === "pending" && m.nextAttemptAt ? ` · next try ${when(m.nextAttemptAt)}` : ""}
                  </span>
                  {m.lastError && m.status !== "sent" ? <span className="block text-xs text-brick-700">Last error: {m.lastError}</span> : null}
                </span>
                {m.status === "failed" ? <RowAction action={resendMessageAction} hidden={{ id: m.id }} label="Send again" /> : null}
              </li>
            ))}
          </ul>
        )}
      </Panel>
    </div>
  );
}
