import { layoutGraph } from "@/components/graph/layout";
import type { Workbench } from "./workbenchState";

/** Positions for every node by dagre's layered layout, finer models above the models they map onto. */
export function layoutWorkbench(w: Workbench, size: { width: number; height: number }): Record<string, { x: number; y: number }> {
  const placed = layoutGraph(
    w.nodes.map((n) => ({ id: n.id, label: n.name })),
    w.edges.map((e) => ({ id: e.id, source: e.source, target: e.target })),
    { direction: "TB", nodeWidth: size.width, nodeHeight: size.height, rankSep: 110, nodeSep: 60 },
  );
  return Object.fromEntries(placed.nodes.map((n) => [n.id, { x: n.x, y: n.y }]));
}

/** Where a new node goes: below its source, or to the right of everything on the canvas. */
export function placeNew(w: Workbench, below: string | null): { x: number; y: number } {
  const source = below ? w.nodes.find((n) => n.id === below) : undefined;
  if (source) {
    const siblings = w.edges.filter((e) => e.source === source.id).length;
    return { x: source.x + siblings * 230, y: source.y + 190 };
  }
  const right = w.nodes.reduce((m, n) => Math.max(m, n.x + 240), 0);
  return { x: right, y: 0 };
}
