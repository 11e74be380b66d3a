import type { GraphEdge, GraphNode } from "./types";

/**
 * Layers by coarseness: a node's layer is the length of the longest chain of maps from it down to a
 * model that coarse-grains onto nothing further (layer 0, drawn at the bottom), so whatever a model
 * coarse-grains onto sits strictly below it. Nodes that map onto each other (one strongly connected
 * component, found by Tarjan's algorithm, SIAM J. Comput. 1, 146, 1972) share a layer.
 */
export function coarsenessLayers(nodes: { id: string }[], edges: { source: string; target: string }[]): Map<string, number> {
  const ids = nodes.map((n) => n.id);
  const known = new Set(ids);
  const out = new Map<string, string[]>(ids.map((id) => [id, []]));
  for (const e of edges) if (known.has(e.source) && known.has(e.target) && e.source !== e.target) out.get(e.source)!.push(e.target);

  const component = new Map<string, number>();
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const onStack = new Set<string>();
  let counter = 0;
  let components = 0;
  // Iterative Tarjan (an atlas can be deep enough to overflow recursion).
  for (const root of ids) {
    if (index.has(root)) continue;
    const work: [string, number][] = [[root, 0]];
    while (work.length) {
      const frame = work[work.length - 1];
      const [v, i] = frame;
      if (i === 0) {
        index.set(v, counter);
        low.set(v, counter++);
        stack.push(v);
        onStack.add(v);
      }
      const next = out.get(v)!;
      if (i < next.length) {
        frame[1] = i + 1;
        const w = next[i];
        if (!index.has(w)) work.push([w, 0]);
        else if (onStack.has(w)) low.set(v, Math.min(low.get(v)!, index.get(w)!));
        continue;
      }
      work.pop();
      if (work.length) {
        const parent = work[work.length - 1][0];
        low.set(parent, Math.min(low.get(parent)!, low.get(v)!));
      }
      if (low.get(v) === index.get(v)) {
        let w: string;
        do {
          w = stack.pop()!;
          onStack.delete(w);
          component.set(w, components);
        } while (w !== v);
        components++;
      }
    }
  }
  // Tarjan numbers components in reverse topological order: every edge between components goes
  // from a higher number to a lower one, so one pass in increasing order settles each layer.
  const members: string[][] = Array.from({ length: components }, () => []);
  for (const id of ids) members[component.get(id)!].push(id);
  const layerOf = new Array<number>(components).fill(0);
  for (let c = 0; c < components; c++) {
    for (const v of members[c]) for (const w of out.get(v)!) if (component.get(w) !== c) layerOf[c] = Math.max(layerOf[c], layerOf[component.get(w)!] + 1);
  }
  return new Map(ids.map((id) => [id, layerOf[component.get(id)!]]));
}

export type LayeredOptions = {
  /** @default 160 */
  nodeWidth?: number;
  /** @default 58 */
  nodeHeight?: number;
  /** Widest a row may be before a layer wraps onto a second line. @default 1060 */
  maxWidth?: number;
  /** Horizontal space between nodes. @default 18 */
  gap?: number;
  /** Vertical space between the lines of a wrapped layer: room for the labels of edges leaving the upper line. @default 44 */
  lineGap?: number;
  /** Vertical space between layers: room for a row or two of edge labels. @default 100 */
  layerGap?: number;
};

/**
 * Places nodes in horizontal bands, the finest layer on top and layer 0 (the coarsest) at the
 * bottom; within a band, nodes are ordered by the mean position of what they map onto (the
 * barycentre heuristic of Sugiyama, Tagawa & Toda, IEEE SMC 11, 109, 1981), and a band wider than
 * the page wraps onto more lines.
 */
export function layoutLayers(nodes: GraphNode[], edges: GraphEdge[], options: LayeredOptions = {}) {
  const { nodeWidth = 160, nodeHeight = 58, maxWidth = 1060, gap = 18, lineGap = 44, layerGap = 100 } = options;
  const layers = coarsenessLayers(nodes, edges);
  const top = Math.max(0, ...layers.values());
  const perRow = Math.max(1, Math.floor((maxWidth + gap) / (nodeWidth + gap)));
  const xOf = new Map<string, number>();
  const targets = new Map<string, string[]>();
  const degree = new Map<string, number>();
  for (const e of edges) {
    targets.set(e.source, [...(targets.get(e.source) ?? []), e.target]);
    degree.set(e.target, (degree.get(e.target) ?? 0) + 1);
    degree.set(e.source, (degree.get(e.source) ?? 0) - 1);
  }
  const placed: (GraphNode & { x: number; y: number; width: number; height: number; layer: number })[] = [];
  const bands: { layer: number; y: number; height: number }[] = [];
  let y = 0;
  for (let layer = 0; layer <= top; layer++) {
    // Lay out from the bottom up so each node's targets already have positions; flip y at the end.
    const band = nodes.filter((n) => layers.get(n.id) === layer);
    if (band.length === 0) continue;
    const centre = (n: GraphNode) => {
      const xs = (targets.get(n.id) ?? []).map((t) => xOf.get(t)).filter((x): x is number => x !== undefined);
      return xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : Number.POSITIVE_INFINITY;
    };
    const ordered = wrapByFlow(band, perRow, degree).flatMap((line) =>
      line.map((n) => ({ n, c: centre(n) })).sort((a, b) => (a.c === b.c ? 0 : a.c - b.c) || a.n.id.localeCompare(b.n.id, "en", { numeric: true })),
    );
    const lines = Math.ceil(ordered.length / perRow);
    ordered.forEach(({ n }, i) => {
      const line = Math.floor(i / perRow);
      const inLine = Math.min(perRow, ordered.length - line * perRow);
      const offset = (maxWidth - (inLine * nodeWidth + (inLine - 1) * gap)) / 2;
      const x = Math.max(0, offset) + (i % perRow) * (nodeWidth + gap);
      xOf.set(n.id, x + nodeWidth / 2);
      placed.push({ ...n, x, y: y + line * (nodeHeight + lineGap), width: nodeWidth, height: nodeHeight, layer });
    });
    const height = lines * nodeHeight + (lines - 1) * lineGap;
    bands.push({ layer, y, height });
    y += height + layerGap;
  }
  const total = Math.max(0, y - layerGap);
  const flip = (yy: number, h: number) => total - yy - h;
  return {
    nodes: placed.map((p) => ({ ...p, y: flip(p.y, p.height) })),
    edges: edges.filter((e) => xOf.has(e.source) && xOf.has(e.target)),
    width: maxWidth,
    height: total,
    bands: bands.map((b) => ({ ...b, y: flip(b.y, b.height) })),
  };
}

/**
 * Splits a layer that is wider than a line into lines, bottom line first: the nodes that mostly send
 * edges down go to the bottom line and those that mostly receive edges from above go to the top one
 * (by in-degree minus out-degree), so that fewer edges have to cross the layer's own lines.
 */
function wrapByFlow<T extends { id: string }>(band: T[], perRow: number, degree: Map<string, number>): T[][] {
  const flow = (n: T) => degree.get(n.id) ?? 0;
  const sorted = [...band].sort((a, b) => flow(a) - flow(b) || a.id.localeCompare(b.id, "en", { numeric: true }));
  return Array.from({ length: Math.ceil(sorted.length / perRow) }, (_, i) => sorted.slice(i * perRow, (i + 1) * perRow));
}
