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

/** Splits a graph into its weakly connected components (edges to unknown nodes ignored), largest first. */
export function connectedComponents(nodes: GraphNode[], edges: GraphEdge[]): { nodes: GraphNode[]; edges: GraphEdge[] }[] {
  const parent = new Map<string, string>(nodes.map((n) => [n.id, n.id]));
  const find = (id: string): string => {
    let root = id;
    while (parent.get(root) !== root) root = parent.get(root)!;
    parent.set(id, root);
    return root;
  };
  for (const e of edges) if (parent.has(e.source) && parent.has(e.target)) parent.set(find(e.source), find(e.target));
  const groups = new Map<string, { nodes: GraphNode[]; edges: GraphEdge[] }>();
  const seen = new Set<string>();
  for (const n of nodes) {
    if (seen.has(n.id)) continue;
    seen.add(n.id);
    const group = groups.get(find(n.id)) ?? { nodes: [], edges: [] };
    group.nodes.push(n);
    groups.set(find(n.id), group);
  }
  for (const e of edges) if (parent.has(e.source) && parent.has(e.target)) groups.get(find(e.source))!.edges.push(e);
  return [...groups.values()].sort((a, b) => b.nodes.length - a.nodes.length);
}

/**
 * Lays out each connected component on its own and packs them in rows no wider than `maxWidth`
 * (a component wider than that gets a row to itself), so that an atlas of many small families stays
 * readable at full size instead of becoming one long, thin band.
 */
export function layoutPacked(nodes: GraphNode[], edges: GraphEdge[], options: LayoutOptions & { maxWidth?: number; gap?: number } = {}): GraphLayout {
  const { maxWidth = 1100, gap = 24, ...layoutOptions } = options;
  const placed: GraphLayout = { nodes: [], edges: [], width: 0, height: 0 };
  let x = 0;
  let y = 0;
  let rowHeight = 0;
  for (const component of connectedComponents(nodes, edges)) {
    const part = layoutGraph(component.nodes, component.edges, layoutOptions);
    if (x > 0 && x + part.width > maxWidth) {
      x = 0;
      y += rowHeight + gap;
      rowHeight = 0;
    }
    for (const n of part.nodes) placed.nodes.push({ ...n, x: n.x + x, y: n.y + y });
    placed.edges.push(...part.edges);
    x += part.width + gap;
    rowHeight = Math.max(rowHeight, part.height);
    placed.width = Math.max(placed.width, x - gap);
    placed.height = Math.max(placed.height, y + rowHeight);
  }
  return placed;
}

/**
 * The part of a directed graph that a node lies on: everything it reaches and everything that reaches
 * it (what it coarse-grains onto, and what coarse-grains onto it), with the edges among those nodes.
 */
export function neighbourhood(nodes: GraphNode[], edges: GraphEdge[], focus: string): { nodes: GraphNode[]; edges: GraphEdge[] } {
  const walk = (next: (e: GraphEdge) => [string, string]) => {
    const seen = new Set([focus]);
    const queue = [focus];
    while (queue.length) {
      const at = queue.shift()!;
      for (const e of edges) {
        const [from, to] = next(e);
        if (from === at && !seen.has(to)) {
          seen.add(to);
          queue.push(to);
        }
      }
    }
    return seen;
  };
  const down = walk((e) => [e.source, e.target]);
  const up = walk((e) => [e.target, e.source]);
  const keep = new Set([...down, ...up]);
  if (!nodes.some((n) => n.id === focus)) return { nodes: [], edges: [] };
  return {
    nodes: nodes.filter((n) => keep.has(n.id)),
    edges: edges.filter((e) => (down.has(e.source) && down.has(e.target)) || (up.has(e.source) && up.has(e.target))),
  };
}
