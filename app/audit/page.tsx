import type { Metadata } from "next";
import Link from "next/link";
import { Panel } from "@/components/ui/panel";
import { buttonClass } from "@/components/ui/button";
import { getMapLines, listAuditActions, listAuditEvents } from "@/db/queries/audit";
import { listMembers } from "@/db/queries/memberships";
import { requireAction } from "@/server/context";
import { describeEvent } from "@/server/team/log";

export const metadata: Metadata = { title: "Audit log" };

const PAGE = 25;
const TIME = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "medium", timeZone: "UTC" });

type Search = { action?: string; actor?: string; page?: string };

function href(q: Search): string {
  const p = new URLSearchParams(Object.entries(q).filter(([, v]) => v) as [string, string][]);
  return p.size ? `/audit?${p}` : "/audit";
}

/** Admins browse the whole log: who did what, when; filtered by kind and person; paged in the URL. */
export default async function AuditPage({ searchParams }: { searchParams: Promise<Search> }) {
  const { workspace } = await requireAction("audit:browse");
  const q = await searchParams;
  const [actions, members] = await Promise.all([listAuditActions({ workspaceId: workspace.id }), listMembers({ workspaceId: workspace.id })]);
  const action = actions.find((a) => a === q.action);
  const actor = members.find((m) => m.userId === q.actor)?.userId;
  const page = Math.max(1, Math.min(10_000, Number.parseInt(q.page ?? "1", 10) || 1));
  const { items, total } = await listAuditEvents({ workspaceId: workspace.id, action, actorId: actor, limit: PAGE, offset: (page - 1) * PAGE });
  const names = await getMapLines({ workspaceId: workspace.id, mapIds: items.filter((e) => e.subjectType === "map").map((e) => e.subjectId) });
  const pages = Math.max(1, Math.ceil(total / PAGE));
  const select = "rounded-md border border-line-strong bg-paper-raised px-2 py-1.5 text-sm";
  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <div>
        <p className="text-sm text-ink-soft">{workspace.name}</p>
        <h1 className="mt-1 text-3xl font-semibold tracking-tight text-tide-900">Audit log</h1>
      </div>
      <form className="flex flex-wrap items-end gap-3" action="/audit">
        <label className="space-y-1 text-sm">
          <span className="block font-medium">Kind</span>
          <select name="action" defaultValue={action ?? ""} className={select}>
            <option value="">all kinds</option>
            {actions.map((a) => (
              <option key={a} value={a}>
                {a}
              </option>
            ))}
          </select>
        </label>
        <label className="space-y-1 text-sm">
          <span className="block font-medium">Person</span>
          <select name="actor" defaultValue={actor ?? ""} className={select}>
            <option value="">everyone</option>
            {members.map((m) => (
              <option key={m.userId} value={m.userId}>
                {m.name}
              </option>
            ))}
          </select>
        </label>
        <button type="submit" className={buttonClass("secondary")}>
          Filter
        </button>
      </form>
      <Panel title={`${total} event${total === 1 ? "" : "s"}`}>
        {items.length === 0 ? (
          <p className="text-sm text-ink-soft">No event matches.</p>
        ) : (
          <table className="w-full text-left text-sm">
            <thead className="text-xs uppercase tracking-wider text-ink-faint">
              <tr>
                <th className="py-2 pr-3 font-semibold">When (UTC)</th>
                <th className="py-2 pr-3 font-semibold">Who</th>
                <th className="py-2 pr-3 font-semibold">What</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-line">
              {items.map((e) => {
                const { text, href: link } = describeEvent(e, names.get(e.subjectId));
                return (
                  <tr key={e.id} className="align-top">
                    <td className="whitespace-nowrap py-2 pr-3 text-xs text-ink-soft">{TIME.format(e.createdAt)}</td>
                    <td className="py-2 pr-3">{e.actorName ?? "—"}</td>
                    <td className="py-2 pr-3">
                      <span className="mr-2 rounded bg-paper px-1.5 font-mono text-xs text-ink-soft">{e.action}</span>
                      {link ? (
                        <Link href={link} className="text-tide-800 hover:underline">
                          {text}
                        </Link>
                      ) : (
                        text
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
      </Panel>
      <nav aria-label="Pages" className="flex items-center justify-between text-sm">
        {page > 1 ? <Link href={href({ action, actor, page: String(page - 1) })} className="text-tide-700 underline">← Newer</Link> : <span />}
        <span className="text-ink-soft">
          Page {page} of {pages}
        </span>
        {page < pages ? <Link href={href({ action, actor, page: String(page + 1) })} className="text-tide-700 underline">Older →</Link> : <span />}
      </nav>
    </div>
  );
}
