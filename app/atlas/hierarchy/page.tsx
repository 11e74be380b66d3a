import type { Metadata } from "next";
import Link from "next/link";
import { Suspense } from "react";
import { PageHeader } from "@/components/atlas/page-header";
import { Skeleton } from "@/components/atlas/skeleton";
import { AtlasGraph } from "@/components/graph/atlas-graph";
import { groupBySymmetryClass } from "@/components/graph/groupBySymmetryClass";
import { layoutLayers } from "@/components/graph/coarsenessLayers";
import { neighbourhood } from "@/components/graph/layout";
import { Panel } from "@/components/ui/panel";
import { getClassHierarchy } from "@/db/queries/atlas";
import { MAP_KINDS } from "@/db/schema";
import { getWorkspaceContext } from "@/server/context";

export const metadata: Metadata = { title: "ECA hierarchy" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

function numberOf(value: string | string[] | undefined, digits: number): number | null {
  const text = Array.isArray(value) ? value[0] : value;
  return text && new RegExp(`^\\d{1,${digits}}$`).test(text) ? Number(text) : null;
}

/** The hierarchy's view, all of it in the URL: block size, map kind, maps onto constant rules shown, focused class. */
type View = { block: number | null; kind: string | null; constants: boolean; focus: number | null };

function hierarchyHref(view: View): string {
  const query = new URLSearchParams();
  if (view.block !== null) query.set("block", String(view.block));
  if (view.kind) query.set("kind", view.kind);
  if (view.constants) query.set("constants", "1");
  if (view.focus !== null) query.set("focus", String(view.focus));
  const text = query.toString();
  return text ? `/atlas/hierarchy?${text}` : "/atlas/hierarchy";
}

/** The class of the two constant rules 0 and 255 (0 ↔ 255 under 0↔1 exchange): nearly every rule maps onto it. */
const CONSTANT_CLASS = 0;

async function Hierarchy({ workspaceId, view }: { workspaceId: string; view: View }) {
  const { block, focus } = view;
  const hierarchy = await getClassHierarchy({ workspaceId, kind: "eca" });
  const members = hierarchy.groups.flatMap((g) =>
    g.models.flatMap((m) => (m.rule !== null ? [{ id: m.id, rule: m.rule, symmetryClass: m.symmetryClass ?? m.rule }] : [])),
  );
  const classOf = new Map(members.map((m) => [m.id, m.symmetryClass]));
  const constantMaps = hierarchy.edges.filter((e) => classOf.get(e.targetModelId) === CONSTANT_CLASS && classOf.get(e.sourceModelId) !== CONSTANT_CLASS).length;
  const edges = hierarchy.edges.filter(
    (e) =>
      (block === null || e.block === block) &&
      (!view.kind || e.kind === view.kind) &&
      (view.constants || classOf.get(e.targetModelId) !== CONSTANT_CLASS || classOf.get(e.sourceModelId) === CONSTANT_CLASS),
  );
  const grouped = groupBySymmetryClass(members, edges);
  const connected = new Set([...grouped.edges.flatMap((e) => [e.source, e.target]), ...grouped.nodes.filter((n) => n.loop).map((n) => n.id)]);
  const all = grouped.nodes.filter((n) => connected.has(n.id));
  const focused = focus !== null ? neighbourhood(grouped.nodes, grouped.edges, `class-${focus}`) : null;
  const drawn = focused ? focused.nodes : all;
  const drawnEdges = focused ? focused.edges : grouped.edges;
  const isolated = grouped.groups.filter((g) => !connected.has(`class-${g.symmetryClass}`));
  // Layers by coarseness: what a class coarse-grains onto is drawn below it.
  const layout = layoutLayers(drawn, drawnEdges, { nodeWidth: 160, nodeHeight: 58, maxWidth: 1060 });
  const height = Math.min(1600, Math.max(320, Math.round(layout.height * Math.min(1, 1060 / Math.max(layout.width, 1))) + 60));
  const modelOf = new Map(hierarchy.groups.flatMap((g) => g.models.map((m) => [m.rule, m.id] as const)));

  return (
    <div className="space-y-6">
      <p className="text-sm text-ink-soft">
        {members.length} ECAs in {grouped.groups.length} symmetry classes; {edges.length} certified map{edges.length === 1 ? "" : "s"}
        {block !== null ? ` at block size ${block}` : ""} between them, drawn as {grouped.edges.length} class-to-class edge
        {grouped.edges.length === 1 ? "" : "s"}. Each node is a symmetry class: the rules equivalent under left–right reflection and 0↔1 exchange, named by its smallest rule.
        Finer classes are drawn above, what they coarse-grain onto below ({layout.bands.length} layer{layout.bands.length === 1 ? "" : "s"}); ↻ marks maps between rules of the same class.
      </p>
      {!view.constants && constantMaps > 0 ? (
        <p className="rounded-md bg-paper px-3 py-2 text-sm text-ink-soft">
          {constantMaps} maps onto the constant rules 0 and 255 are hidden: nearly every rule has them.{" "}
          <Link href={hierarchyHref({ ...view, constants: true })} className="font-medium text-tide-700 underline">
            Show them
          </Link>
        </p>
      ) : view.constants ? (
        <p className="text-sm text-ink-soft">
          <Link href={hierarchyHref({ ...view, constants: false })} className="font-medium text-tide-700 underline">
            Hide the maps onto the constant rules
          </Link>
        </p>
      ) : null}
      {focused ? (
        <p className="text-sm text-ink-soft">
          Showing class {focus}, what it coarse-grains onto and what coarse-grains onto it ({drawn.length} classes).{" "}
          <Link href={hierarchyHref({ ...view, focus: null })} className="font-medium text-tide-700 underline">
            Show the whole hierarchy
          </Link>
        </p>
      ) : (
        <p className="text-sm text-ink-soft">Drag to pan, scroll or pinch to zoom; pick a class below to see only its ancestors and descendants.</p>
      )}
      {drawn.length > 0 ? (
        <AtlasGraph
          layout={layout}
          height={focused ? height : Math.max(height, 560)}
          readableZoom={focused ? 0.1 : 0.6}
          minimap={!focused}
          selected={focused ? `class-${focus}` : null}
        />
      ) : (
        <p className="rounded-md bg-paper px-3 py-6 text-center text-sm text-ink-faint">No coarse-graining between ECAs is certified{block !== null ? " at this block size" : ""} yet.</p>
      )}
      <Panel title="Symmetry classes (rules equal up to reflection and 0↔1 exchange)">
        <ul className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:gap-x-6 lg:grid-cols-4">
          {grouped.groups.map((g) => (
            <li key={g.symmetryClass} className="flex items-baseline gap-2 border-b border-line/60 py-1">
              <Link
                href={hierarchyHref({ ...view, focus: g.symmetryClass })}
                aria-current={g.symmetryClass === focus ? "true" : undefined}
                title={`Draw only class ${g.symmetryClass} and the classes above and below it`}
                className={`w-16 shrink-0 whitespace-nowrap font-mono text-xs sm:w-20 hover:text-tide-700 ${g.symmetryClass === focus ? "font-semibold text-tide-700" : "text-ink-faint"}`}
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
  const kindText = Array.isArray(params.kind) ? params.kind[0] : params.kind;
  const view: View = {
    block: numberOf(params.block, 2),
    kind: kindText && (MAP_KINDS as readonly string[]).includes(kindText) ? kindText : null,
    constants: params.constants === "1",
    focus: numberOf(params.focus, 3),
  };
  const { block } = view;
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
            href={hierarchyHref({ ...view, block: b })}
            aria-current={b === block ? "page" : undefined}
            className={`rounded-md px-2.5 py-1 ${b === block ? "bg-tide-700 text-paper-raised" : "text-tide-700 hover:bg-tide-50"}`}
          >
            {b === null ? "all" : `N = ${b}`}
          </Link>
        ))}
      </nav>
      <nav aria-label="Map kind" className="flex flex-wrap items-center gap-1 text-sm">
        <span className="mr-1 text-ink-faint">Map kind:</span>
        {[null, "projection", "coarse-graining"].map((k) => (
          <Link
            key={String(k)}
            href={hierarchyHref({ ...view, kind: k })}
            aria-current={k === view.kind ? "page" : undefined}
            className={`rounded-md px-2.5 py-1 ${k === view.kind ? "bg-tide-700 text-paper-raised" : "text-tide-700 hover:bg-tide-50"}`}
          >
            {k ?? "all"}
          </Link>
        ))}
      </nav>
      <Suspense key={hierarchyHref(view)} fallback={<Skeleton lines={10} label="Laying out the hierarchy" />}>
        <Hierarchy workspaceId={workspace.id} view={view} />
      </Suspense>
    </div>
  );
}
