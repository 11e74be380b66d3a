import { describe, expect, it } from "vitest";
import { canvasBounds, LABEL_MAX_WIDTH } from "./canvasBounds";
import { NODE_HEIGHT, NODE_WIDTH } from "./canvasSize";

describe("canvasBounds", () => {
  it("is nothing on an empty canvas, and a lone node's own box", () => {
    expect(canvasBounds([], [])).toBeNull();
    expect(canvasBounds([{ id: "a", x: 10, y: 20 }], [])).toEqual({ x: 10, y: 20, width: NODE_WIDTH, height: NODE_HEIGHT });
  });

  it("reaches past the nodes to the right end of an edge's label", () => {
    const nodes = [
      { id: "a", x: 0, y: 0 },
      { id: "b", x: 0, y: 200 },
    ];
    const text = "projection N=2 (0110)"; // 21 characters
    const b = canvasBounds(nodes, [{ source: "a", target: "b", text, refused: false }])!;
    // Label: left at the midpoint (x = 95) plus 95 + 14, about 6.1 px a character plus 14 of padding.
    const labelRight = NODE_WIDTH / 2 + NODE_WIDTH / 2 + 14 + 21 * 6.1 + 14;
    expect(b.x).toBe(0);
    expect(b.width).toBeCloseTo(labelRight, 6);
    expect(b.width).toBeGreaterThan(NODE_WIDTH + 100);
    expect(b.height).toBe(200 + NODE_HEIGHT);
  });

  it("gives a refused edge's label the full width and room for its counterexample", () => {
    const nodes = [
      { id: "a", x: 0, y: 0 },
      { id: "b", x: 0, y: 100 },
    ];
    const b = canvasBounds(nodes, [{ source: "a", target: "b", text: "x", refused: true }])!;
    expect(b.x + b.width).toBe(NODE_WIDTH + 14 + LABEL_MAX_WIDTH);
    expect(b.y).toBeLessThan(0);
    expect(b.y + b.height).toBeGreaterThan(100 + NODE_HEIGHT);
  });
});
