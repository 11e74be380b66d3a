import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { Panel } from "@/components/ui/panel";
import { getPublicWorkspace, listPublicModels, listRecentMaps } from "@/db/queries/workspaces";

export const metadata: Metadata = { title: "Public atlas" };

/**
 * A workspace's read-only public view, for anyone, signed in or not, while an admin has it on.
 * It shows models and certified maps only: no member list, no authors, no mail addresses, no tokens.
 */
export default async function PublicWorkspacePage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const workspace = slug.length <= 100 ? await getPublicWorkspace({ slug }) : null;
  if (!workspace) notFound();
  const [recent, models] = await Promise.all([listRecentMaps({ workspaceId: workspace.id, limit: 50 }), listPublicModels({ workspaceId: workspace.id })]);
  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <div>
        <p className="text-sm text-ink-soft">Public, read-only view</p>
        <h1 className="mt-1 text-3xl font-semibold tracking-tight text-tide-900">{workspace.name}</h1>
        <p className="mt-2 text-sm text-ink-soft">Every map below was certified: its commuting square was checked exhaustively in exact arithmetic before it was stored.</p>
      </div>
      <div className="grid gap-6 lg:grid-cols-[1.6fr_1fr]">
        <Panel title={`Certified maps (${recent.length})`}>
          {recent.length === 0 ? (
            <p className="text-sm text-ink-soft">No certified map yet.</p>
          ) : (
            <ul className="divide-y divide-line">
              {recent.map((m) => (
                <li key={m.id} className="py-2.5">
                  <p className="text-sm font-medium text-ink">
                    {m.sourceName} → {m.targetName}
                  </p>
                  <p className="text-xs text-ink-soft">
                    {m.kind}
                    {m.block ? ` at block ${m.block}` : ""} · {m.summary}
                  </p>
                  <p className="truncate font-mono text-[11px] text-ink-faint" title={m.certificateAddress}>
                    {m.certificateAddress}
                  </p>
                </li>
              ))}
            </ul>
          )}
        </Panel>
        <Panel title={`Models (${models.length})`}>
          <ul className="divide-y divide-line">
            {models.map((m) => (
              <li key={m.id} className="flex items-center justify-between gap-2 py-2 text-sm">
                <span className="truncate">{m.name}</span>
                <span className="rounded bg-paper px-1.5 font-mono text-xs text-ink-soft">{m.kind}</span>
              </li>
            ))}
          </ul>
        </Panel>
      </div>
    </div>
  );
}
