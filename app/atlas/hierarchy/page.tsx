import type { Metadata } from "next";
import Link from "next/link";
import { Suspense } from "react";
import { PageHeader } from "@/components/atlas/page-header";
import { Skeleton } from "@/components/atlas/skeleton";
import { AtlasGraph } from "@/components/graph/atlas-graph";
import { groupBySymmetryClass } from "@/components/graph/groupBySymmetryClass";
import { layoutPacked, neighbourhood } from "@/components/graph/layout";
import { Panel } from "@/components/ui/panel";
import { getClassHierarchy } from "@/db/queries/atlas";
import { getWorkspaceContext } from "@/server/context";

export const metadata: Metadata = { title: "ECA hierarchy" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

function numberOf(value: string | string[] | undefined, digits: number): number | null {
  const text = Array.isArray(value) ? value[0] : value;
  return text && new RegExp(`^\\d{1,${digits}}$`).test(text) ? Number(text) : null;
}

function hierarchyHref(block: number | null, focus: number | null): string {
  const query = new URLSearchParams();
  if (block !== null) query.set("block", String(block));
  if (focus !== null) query.set("focus", String(focus));
  const text = query.toString();
  return text ? `/atlas/hierarchy?${text}` : "/atlas/hierarchy";
}

async function Hierarchy({ workspaceId, block, focus }: { workspaceId: string; block: number | null; focus: number | null }) {
  const hierarchy = await getClassHierarchy({ workspaceId, kind: "eca" });
  const members = hierarchy.groups.flatMap((g) =>
    g.models.flatMap((m) => (m.rule !== null ? [{ id: m.id, rule: m.rule, symmetryClass: m.symmetryClass ?? m.rule }] : [])),
  );
  const edges = block === null ? hierarchy.edges : hierarchy.edges.filter((e) => e.block === block);
  const grouped = groupBySymmetryClass(members, edges);
  const connected = new Set([...grouped.edges.flatMap((e) => [e.source, e.target]), ...grouped.nodes.filter((n) => n.loop).map((n) => n.id)]);
  const all = grouped.nodes.filter((n) => connected.has(n.id));
  const focused = focus !== null ? neighbourhood(grouped.nodes, grouped.edges, `class-${focus}`) : null;
  const drawn = focused ? focused.nodes : all;
  const drawnEdges = focused ? focused.edges : grouped.edges;
  const isolated = grouped.groups.filter((g) => !connected.has(`class-${g.symmetryClass}`));
  // Each family of classes is laid out on its own and the families packed in rows as wide as the page.
  const layout = layoutPacked(drawn, drawnEdges, { nodeWidth: 160, nodeHeight: 58, nodeSep: 18, maxWidth: 1060 });
  const height = Math.min(1600, Math.max(320, Math.round(layout.height * Math.min(1, 1060 / Math.max(layout.width, 1))) + 60));
  const modelOf = new Map(hierarchy.groups.flatMap((g) => g.models.map((m) => [m.rule, m.id] as const)));

  return (
    <div className="space-y-6">
      <p className="text-sm text-ink-soft">
        {members.length} ECAs in {grouped.groups.length} symmetry classes; {edges.length} certified map{edges.length === 1 ? "" : "s"}
        {block !== null ? ` at block size ${block}` : ""} between them, drawn as {grouped.edges.length} class-to-class edge
        {grouped.edges.length === 1 ? "" : "s"}. Arrows point from the finer rule to the one it coarse-grains onto; ↻ marks maps between rules of the same class.
      </p>
      {focused ? (
        <p className="text-sm text-ink-soft">
          Showing class {focus}, what it coarse-grains onto and what coarse-grains onto it ({drawn.length} classes).{" "}
          <Link href={hierarchyHref(block, null)} className="font-medium text-tide-700 underline">
            Show the whole hierarchy
          </Link>
        </p>
      ) : (
        <p className="text-sm text-ink-soft">Drag to pan, scroll to zoom; pick a class below to see only its ancestors and descendants.</p>
      )}
      {drawn.length > 0 ? (
        <AtlasGraph layout={layout} height={focused ? height : Math.max(height, 560)} readableZoom={focused ? 0.1 : 0.6} minimap={!focused} />
      ) : (
        <p className="rounded-md bg-paper px-3 py-6 text-center text-sm text-ink-faint">No coarse-graining between ECAs is certified{block !== null ? " at this block size" : ""} yet.</p>
      )}
      <Panel title="Symmetry classes (reflection and 0↔1 complement)">
        <ul className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2 lg:grid-cols-4">
          {grouped.groups.map((g) => (
            <li key={g.symmetryClass} className="flex items-baseline gap-2 border-b border-line/60 py-1">
              <Link
                href={hierarchyHref(block, g.symmetryClass)}
                aria-current={g.symmetryClass === focus ? "true" : undefined}
                title={`Draw only class ${g.symmetryClass} and the classes above and below it`}
                className={`w-20 shrink-0 whitespace-nowrap font-mono text-xs hover:text-tide-700 ${g.symmetryClass === focus ? "font-semibold text-tide-700" : "text-ink-faint"}`}
              >
                class {g.symmetryClass}
              </Link>
              <span className="flex flex-wrap gap-x-2 font-mono">
                {g.rules.map((r) => (
                  <Link key={r} href={`/atlas/models/${modelOf.get(r)}`} className="text-tide-800 underline-offset-2 hover:underline">
                    {r}
                  </Link>
                ))}
              </span>
            </li>
          ))}
        </ul>
        {isolated.length > 0 ? (
          <p className="mt-3 text-xs text-ink-faint">
            {isolated.length} class{isolated.length === 1 ? " has" : "es have"} no certified map to or from another ECA and {isolated.length === 1 ? "is" : "are"} left out of the drawing.
          </p>
        ) : null}
      </Panel>
    </div>
  );
}

export default async function HierarchyPage({ searchParams }: Props) {
  const [{ workspace }, params] = await Promise.all([getWorkspaceContext(), searchParams]);
  const block = numberOf(params.block, 2);
  const focus = numberOf(params.focus, 3);
  const blocks = [null, 2, 3, 4];
  return (
    <div className="mx-auto max-w-6xl space-y-5 px-5 py-8">
      <PageHeader
        eyebrow={
          <Link href="/atlas" className="underline-offset-2 hover:underline">
            Atlas
          </Link>
        }
        title="ECA hierarchy"
        lead="All elementary cellular automata in this atlas and the certified coarse-grainings between them, one node per symmetry class."
      />
      <nav aria-label="Block size" className="flex items-center gap-1 text-sm">
        <span className="mr-1 text-ink-faint">Block size:</span>
        {blocks.map((b) => (
          <Link
            key={String(b)}
            href={hierarchyHref(b, focus)}
            aria-current={b === block ? "page" : undefined}
            className={`rounded-md px-2.5 py-1 ${b === block ? "bg-tide-700 text-paper-raised" : "text-tide-700 hover:bg-tide-50"}`}
          >
            {b === null ? "all" : `N = ${b}`}
          </Link>
        ))}
      </nav>
      <Suspense key={`${block}:${focus}`} fallback={<Skeleton lines={10} label="Laying out the hierarchy" />}>
        <Hierarchy workspaceId={workspace.id} block={block} focus={focus} />
      </Suspense>
    </div>
  );
}
