import dagre from "@dagrejs/dagre";
import type { GraphEdge, GraphLayout, GraphNode } from "./types";

export type LayoutOptions = {
  /** @default "TB" — finer models above, the models they coarse-grain onto below. */
  direction?: "TB" | "LR";
  /** @default 148 */
  nodeWidth?: number;
  /** @default 44 */
  nodeHeight?: number;
  /** @default 56 */
  rankSep?: number;
  /** @default 24 */
  nodeSep?: number;
};

/**
 * Places the nodes with dagre's layered layout. Positions are top-left corners (what React Flow
 * expects), not dagre's centres. Edges whose ends are not among the nodes are dropped rather than
 * letting dagre invent an unlabelled node for them.
 */
export function layoutGraph(nodes: GraphNode[], edges: GraphEdge[], options: LayoutOptions = {}): GraphLayout {
  const { direction = "TB", nodeWidth = 148, nodeHeight = 44, rankSep = 56, nodeSep = 24 } = options;
  const g = new dagre.graphlib.Graph({ multigraph: true });
  g.setGraph({ rankdir: direction, ranksep: rankSep, nodesep: nodeSep, marginx: 8, marginy: 8 });
  g.setDefaultEdgeLabel(() => ({}));

  const byId = new Map<string, GraphNode>();
  for (const node of nodes) {
    if (byId.has(node.id)) continue;
    byId.set(node.id, node);
    g.setNode(node.id, { width: nodeWidth, height: nodeHeight });
  }
  const kept = edges.filter((e) => byId.has(e.source) && byId.has(e.target));
  for (const edge of kept) g.setEdge(edge.source, edge.target, {}, edge.id);

  dagre.layout(g);

  const placed = [...byId.values()].map((node) => {
    const { x, y } = g.node(node.id) as { x: number; y: number };
    return { ...node, x: x - nodeWidth / 2, y: y - nodeHeight / 2, width: nodeWidth, height: nodeHeight };
  });
  const graph = g.graph() as { width?: number; height?: number };
  return { nodes: placed, edges: kept, width: graph.width ?? 0, height: graph.height ?? 0 };
}
