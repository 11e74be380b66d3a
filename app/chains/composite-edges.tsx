import Link from "next/link";
import { Panel } from "@/components/ui/panel";
import { listCompositeEdges, listWorkspaceComposites, type CompositeEdge } from "@/db/queries/chain-list";

function CompositeList({ edges, modelId }: { edges: CompositeEdge[]; modelId?: string }) {
  const strong = (end: { id: string; name: string }) => (end.id === modelId ? <strong>{end.name}</strong> : end.name);
  return (
    <ul className="space-y-1.5 text-sm" data-composite-edges>
      {edges.map((e) => (
        <li key={e.id} className="flex flex-wrap items-center gap-2">
          <span className="rounded-full bg-tide-50 px-2 py-0.5 text-xs font-semibold text-tide-800 ring-1 ring-tide-600/40">composite</span>
          <span>
            {strong(e.source)} → {strong(e.target)}
          </span>
          <span className="font-mono text-xs text-ink-faint">
            {e.compositeKind}
            {e.compositeBlock !== null ? ` N=${e.compositeBlock}` : ""} · {e.links} links
          </span>
          <Link href={`/chains/${e.id}`} className="ml-auto text-xs text-tide-800 underline">
            {e.name}
          </Link>
        </li>
      ))}
    </ul>
  );
}

/** On a model's page: the composites of certified chains that start or end here, each marked composite and linked to its chain. */
export async function CompositeEdges({ workspaceId, modelId }: { workspaceId: string; modelId: string }) {
  const edges = await listCompositeEdges({ workspaceId, modelId });
  if (edges.length === 0) return null;
  return (
    <Panel title={`Composites of certified chains (${edges.length})`}>
      <CompositeList edges={edges} modelId={modelId} />
    </Panel>
  );
}

/** In the atlas's maps list: the composites of the workspace's certified chains, with the list's kind, block and name filters. */
export async function CompositeMaps({ workspaceId, kind, block, q }: { workspaceId: string; kind?: string; block?: number; q?: string }) {
  const edges = await listWorkspaceComposites({ workspaceId, kind, block, q });
  if (edges.length === 0) return null;
  return (
    <Panel title={`Composite edges: certified chains (${edges.length})`}>
      <CompositeList edges={edges} />
    </Panel>
  );
}
