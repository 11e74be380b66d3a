import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { layoutLayers } from "./coarsenessLayers";
import { drawEdges } from "./drawEdges";
import { edgeCurve } from "./edgeCurve";
import type { Box } from "./geometry";
import { labelSize, placeEdgeLabels } from "./placeEdgeLabels";
import type { GraphEdge } from "./types";

/** Open-interval overlap of two boxes, written here independently of the code under test. */
function overlap(a: Box, b: Box): boolean {
  return a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
}

/** Every pair of boxes that overlap, as index pairs (a brute-force check over all pairs). */
function clashes(boxes: Box[], others: Box[] = []): [number, number][] {
  const found: [number, number][] = [];
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) if (overlap(boxes[i], boxes[j])) found.push([i, j]);
    others.forEach((o, k) => overlap(boxes[i], o) && found.push([i, -1 - k]));
  }
  return found;
}

/** A point of a cubic Bézier curve by de Casteljau's construction (not the Bernstein sum the code uses). */
function deCasteljau(points: readonly { x: number; y: number }[], t: number): { x: number; y: number } {
  let row = [...points];
  while (row.length > 1) row = row.slice(1).map((p, i) => ({ x: row[i].x + t * (p.x - row[i].x), y: row[i].y + t * (p.y - row[i].y) }));
  return row[0];
}

/**
 * A dense hierarchy shaped like the full ECA atlas without the constant rules: 60 classes, most of
 * them mapping onto a few coarse ones, labels like the page's ("N=2,3,4 · 12 maps").
 */
function denseLayout(seed: number, classes = 60, edgeCount = 140) {
  // fast-check's seeded sampling, so that the dense graph is the same on every run.
  const draws = fc.sample(fc.noBias(fc.tuple(fc.nat(classes - 1), fc.nat(999), fc.nat(4), fc.integer({ min: 1, max: 24 }))), {
    seed,
    numRuns: 5000,
  });
  const nodes = Array.from({ length: classes }, (_, i) => ({ id: `c${i}`, label: `class ${i}` }));
  const edges: GraphEdge[] = [];
  const seen = new Set<string>();
  for (const [a, thousandths, blockChoice, count] of draws) {
    if (edges.length === edgeCount) break;
    // Skewed towards a few coarse targets, as the atlas is (most rules map onto ECA 204, 170, 136 …).
    const b = Math.floor((thousandths / 1000) ** 3 * classes);
    const key = `c${a}->c${b}`;
    if (a === b || seen.has(key) || seen.has(`c${b}->c${a}`)) continue;
    seen.add(key);
    const blocks = ["2", "2,3", "3,4", "2,3,4", "4"][blockChoice];
    edges.push({ id: key, source: `c${a}`, target: `c${b}`, label: count > 1 ? `N=${blocks} · ${count} maps` : `N=${blocks}` });
  }
  expect(edges).toHaveLength(edgeCount);
  return layoutLayers(nodes, edges, { nodeWidth: 160, nodeHeight: 58, maxWidth: 1060 });
}

const VERTICAL = { source: { x: 0, y: 0, width: 100, height: 40 }, target: { x: 0, y: 200, width: 100, height: 40 } };

describe("placeEdgeLabels", () => {
  it("puts a lone label at the middle of its edge, at the size it will be drawn", () => {
    // The curve runs from (50, 40) to (50, 200) with both control points at (50, 120): its middle is (50, 120).
    const curve = edgeCurve(VERTICAL.source, VERTICAL.target);
    const placed = placeEdgeLabels([{ id: "e", text: "N=2", curve }], []);
    // 3 characters × 6.4 px + 2 × 4 px = 27.2, rounded up to 28; 14 px tall.
    expect(labelSize("N=2")).toEqual({ width: 28, height: 14 });
    expect(placed.get("e")).toEqual({ x: 36, y: 113, width: 28, height: 14 });
  });

  it("moves the second of two labels on the same edge along the curve rather than on top of the first", () => {
    const curve = edgeCurve(VERTICAL.source, VERTICAL.target);
    const placed = placeEdgeLabels([{ id: "a", text: "N=2", curve }, { id: "b", text: "N=3", curve }], []);
    expect(placed.get("a")!.y).toBe(113);
    const b = placed.get("b")!;
    expect(overlap(placed.get("a")!, b)).toBe(false);
    // t = 0.4 and 0.6 put its centre at y = 107.84 and 132.16, closer than 14 px + 2 × 2 px margin to
    // the first at y = 120; t = 0.3 (y = 94.72) is the first free place, and its centre is on the curve.
    const at = deCasteljau(curve, 0.3);
    expect(at.y).toBeCloseTo(94.72, 9);
    expect(b.x + b.width / 2).toBeCloseTo(at.x, 9);
    expect(b.y + b.height / 2).toBeCloseTo(at.y, 9);
  });

  it("leaves a label out when every place along its edge is under a node", () => {
    const curve = edgeCurve(VERTICAL.source, VERTICAL.target);
    const cover = { x: -20, y: 30, width: 140, height: 180 };
    expect(placeEdgeLabels([{ id: "e", text: "N=2", curve }], [cover]).has("e")).toBe(false);
  });

  it("gives a contested place to the higher priority", () => {
    const curve = edgeCurve(VERTICAL.source, VERTICAL.target);
    const along = [0.5];
    const placed = placeEdgeLabels([{ id: "a", text: "N=2", curve }, { id: "b", text: "N=2,3,4 · 9 maps", curve, priority: 1 }], [], { along });
    expect([...placed.keys()]).toEqual(["b"]);
  });

  it("places no label box over another or over a node on a dense generated hierarchy", () => {
    for (const seed of [1, 2, 3]) {
      const layout = denseLayout(seed);
      const requests = layout.edges.map((e) => {
        const at = new Map(layout.nodes.map((n) => [n.id, n]));
        return { id: e.id, text: e.label!, curve: edgeCurve(at.get(e.source)!, at.get(e.target)!) };
      });
      const placed = placeEdgeLabels(requests, layout.nodes);
      const boxes = [...placed.values()];
      expect(clashes(boxes, layout.nodes)).toEqual([]);
      // Not vacuous: a good share of the 140 labels finds a place.
      expect(boxes.length).toBeGreaterThan(40);
      for (const [id, box] of placed) {
        const request = requests.find((r) => r.id === id)!;
        expect(box.width).toBe(labelSize(request.text).width);
      }
    }
  });

  it("keeps labels apart and off nodes on any random layered graph", () => {
    const graph = fc.integer({ min: 2, max: 24 }).chain((n) =>
      fc.tuple(fc.constant(n), fc.uniqueArray(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 })), { maxLength: 60, selector: ([a, b]) => `${a}-${b}` })),
    );
    fc.assert(
      fc.property(graph, fc.integer({ min: 0, max: 30 }), ([n, pairs], textLength) => {
        const nodes = Array.from({ length: n }, (_, i) => ({ id: `n${i}`, label: `n${i}` }));
        const edges = pairs.filter(([a, b]) => a !== b).map(([a, b]) => ({ id: `${a}-${b}`, source: `n${a}`, target: `n${b}`, label: "x".repeat(textLength) }));
        const layout = layoutLayers(nodes, edges, { maxWidth: 600 });
        const drawn = drawEdges(layout);
        const boxes = drawn.flatMap((e) => (e.labelBox ? [e.labelBox] : []));
        expect(clashes(boxes, layout.nodes)).toEqual([]);
        if (textLength === 0) expect(boxes).toEqual([]);
      }),
      { numRuns: 150 },
    );
  });
});

describe("drawEdges", () => {
  it("draws each edge from the bottom middle of its source to the top middle of its target", () => {
    const layout = {
      nodes: [
        { id: "a", label: "a", ...VERTICAL.source },
        { id: "b", label: "b", x: 300, y: 200, width: 100, height: 40 },
      ],
      edges: [{ id: "a->b", source: "a", target: "b", label: "N=2" }],
    };
    const [edge] = drawEdges(layout);
    expect(edge.path).toBe("M 50 40 C 50 120, 350 120, 350 200");
    expect(edge.emphasis).toBe("normal");
  });

  it("picks out a node's own edges with all their labels and fades the rest", () => {
    const layout = denseLayout(7);
    const hub = "c0"; // the most common target of the skewed generator
    const own = layout.edges.filter((e) => e.source === hub || e.target === hub);
    expect(own.length).toBeGreaterThan(5);
    const before = JSON.stringify(layout);
    const drawn = drawEdges(layout, hub);
    expect(JSON.stringify(layout)).toBe(before);
    expect(drawn.filter((e) => e.emphasis === "picked").map((e) => e.id).sort()).toEqual(own.map((e) => e.id).sort());
    expect(drawn.filter((e) => e.emphasis === "faded")).toHaveLength(layout.edges.length - own.length);
    expect(drawn.filter((e) => e.emphasis === "faded" && e.labelBox)).toEqual([]);
    const picked = drawn.filter((e) => e.labelBox).map((e) => e.labelBox!);
    expect(clashes(picked, layout.nodes)).toEqual([]);
    // With only its own labels competing, most of them are placed.
    expect(picked.length).toBeGreaterThanOrEqual(Math.ceil(own.length * 0.75));
  });

  it("keeps the other edges and their labels when asked, placing the picked node's labels first", () => {
    const layout = denseLayout(7);
    const own = new Set(layout.edges.filter((e) => e.source === "c0" || e.target === "c0").map((e) => e.id));
    const alone = drawEdges(layout, "c0").filter((e) => e.labelBox).map((e) => e.id);
    const kept = drawEdges(layout, "c0", { others: "keep" });
    expect(kept.filter((e) => e.emphasis === "faded")).toEqual([]);
    expect(kept.filter((e) => e.emphasis === "picked").every((e) => own.has(e.id))).toBe(true);
    // The picked node's labels win every place they had alone; other labels fill the room left.
    expect(alone.every((id) => kept.find((e) => e.id === id)!.labelBox)).toBe(true);
    expect(kept.filter((e) => e.labelBox && !own.has(e.id)).length).toBeGreaterThan(0);
    expect(clashes(kept.flatMap((e) => (e.labelBox ? [e.labelBox] : [])), layout.nodes)).toEqual([]);
  });

  it("draws every edge as usual when the picked node is not in the drawing", () => {
    const layout = denseLayout(7);
    expect(drawEdges(layout, "nowhere").every((e) => e.emphasis === "normal")).toBe(true);
  });
});
