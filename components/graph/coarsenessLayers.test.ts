import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { coarsenessLayers, layoutLayers } from "./coarsenessLayers";

/**
 * An independent reference: reachability by Floyd–Warshall, then layers by relaxing
 * layer(u) ≥ layer(v) + 1 over edges leaving u's mutual-reachability class, and
 * layer(u) = layer(v) inside one, until nothing changes.
 */
function referenceLayers(n: number, edges: [number, number][]): number[] {
  const reach = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => i === j));
  for (const [a, b] of edges) reach[a][b] = true;
  for (let k = 0; k < n; k++) for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (reach[i][k] && reach[k][j]) reach[i][j] = true;
  const layer = new Array<number>(n).fill(0);
  for (let changed = true; changed; ) {
    changed = false;
    for (const [a, b] of edges) {
      const same = reach[b][a];
      const want = same ? layer[b] : layer[b] + 1;
      if (layer[a] < want) {
        layer[a] = want;
        changed = true;
      }
      if (same && layer[b] < layer[a]) {
        layer[b] = layer[a];
        changed = true;
      }
    }
  }
  return layer;
}

const graph = fc.integer({ min: 1, max: 14 }).chain((n) =>
  fc.tuple(fc.constant(n), fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 })), { maxLength: 40 })),
);

describe("coarsenessLayers", () => {
  it("puts a chain 146 → 128 → 0 in layers 2, 1, 0", () => {
    const layers = coarsenessLayers([{ id: "146" }, { id: "128" }, { id: "0" }], [
      { source: "146", target: "128" },
      { source: "128", target: "0" },
    ]);
    expect(Object.fromEntries(layers)).toEqual({ "146": 2, "128": 1, "0": 0 });
  });

  it("agrees with an independent reference (Floyd–Warshall and relaxation) on random graphs with cycles", () => {
    fc.assert(
      fc.property(graph, ([n, pairs]) => {
        const nodes = Array.from({ length: n }, (_, i) => ({ id: `n${i}` }));
        const layers = coarsenessLayers(nodes, pairs.map(([a, b]) => ({ source: `n${a}`, target: `n${b}` })));
        expect(nodes.map((x) => layers.get(x.id))).toEqual(referenceLayers(n, pairs));
      }),
      { numRuns: 300 },
    );
  });

  it("draws what a class coarse-grains onto strictly below it unless they map onto each other", () => {
    fc.assert(
      fc.property(graph, ([n, pairs]) => {
        const nodes = Array.from({ length: n }, (_, i) => ({ id: `n${i}`, label: `n${i}` }));
        const edges = pairs.map(([a, b], i) => ({ id: `e${i}`, source: `n${a}`, target: `n${b}` }));
        const layout = layoutLayers(nodes, edges, { maxWidth: 400 });
        const at = new Map(layout.nodes.map((p) => [p.id, p]));
        const reference = referenceLayers(n, pairs);
        for (const [a, b] of pairs) {
          if (reference[a] > reference[b]) expect(at.get(`n${a}`)!.y).toBeLessThan(at.get(`n${b}`)!.y);
        }
        expect(layout.nodes).toHaveLength(n);
        for (const p of layout.nodes) expect(p.x + p.width).toBeLessThanOrEqual(400);
      }),
      { numRuns: 200 },
    );
  });
  it("wraps a wide layer so that the classes most mapped onto sit on its top line, nearest what maps onto them", () => {
    // Eight coarsest classes s0…s7 (six fit on a 1060 px line) and four finer ones that all map onto s0 and s1.
    const sinks = Array.from({ length: 8 }, (_, i) => ({ id: `s${i}`, label: `s${i}` }));
    const finer = Array.from({ length: 4 }, (_, i) => ({ id: `f${i}`, label: `f${i}` }));
    const edges = finer.flatMap((f) => ["s0", "s1"].map((t) => ({ id: `${f.id}->${t}`, source: f.id, target: t })));
    const layout = layoutLayers([...sinks, ...finer], edges, { nodeWidth: 160, nodeHeight: 58, maxWidth: 1060, lineGap: 44 });
    const y = new Map(layout.nodes.map((n) => [n.id, n.y]));
    const lines = [...new Set(sinks.map((s) => y.get(s.id)!))].sort((a, b) => a - b);
    expect(lines).toHaveLength(2);
    expect(lines[1] - lines[0]).toBe(58 + 44);
    expect(["s0", "s1"].map((id) => y.get(id))).toEqual([lines[0], lines[0]]);
    expect(["s2", "s3", "s4", "s5", "s6", "s7"].every((id) => y.get(id) === lines[1])).toBe(true);
    for (const f of finer) expect(y.get(f.id)!).toBeLessThan(lines[0]);
  });
});
