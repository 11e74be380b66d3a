import { NODE_HEIGHT, NODE_WIDTH } from "./canvasSize";

/** Where workbench-canvas draws an edge's label: this far right of the edge's midpoint, vertically centred on it, at most this wide. */
export const LABEL_OFFSET = NODE_WIDTH / 2 + 14;
export const LABEL_MAX_WIDTH = 250;
/** The label's monospace line at 10 px: about 6 px a character, plus its padding and border (an estimate on the safe side). */
const CHAR_WIDTH = 6.1;
const LABEL_PADDING = 14;
const LABEL_HEIGHT = 44;
/** A refused edge's label also draws its counterexample (compact): about this tall and the full width. */
const REFUSED_LABEL_HEIGHT = 230;

export type BoundsNode = { id: string; x: number; y: number };
/** An edge as fit-to-view needs it: its ends, its label's text, and whether it draws a counterexample. */
export type BoundsEdge = { source: string; target: string; text: string; refused: boolean };
export type Rect = { x: number; y: number; width: number; height: number };

/**
 * The rectangle that holds every node and every edge label. React Flow's own fit-to-view counts only
 * the nodes, and the labels sit to the right of each edge, so on a narrow screen a label was cut off
 * at the canvas's right edge.
 */
export function canvasBounds(nodes: BoundsNode[], edges: BoundsEdge[]): Rect | null {
  if (nodes.length === 0) return null;
  let left = Infinity;
  let top = Infinity;
  let right = -Infinity;
  let bottom = -Infinity;
  const grow = (l: number, t: number, r: number, b: number) => {
    left = Math.min(left, l);
    top = Math.min(top, t);
    right = Math.max(right, r);
    bottom = Math.max(bottom, b);
  };
  for (const n of nodes) grow(n.x, n.y, n.x + NODE_WIDTH, n.y + NODE_HEIGHT);
  const at = new Map(nodes.map((n) => [n.id, n]));
  for (const e of edges) {
    const s = at.get(e.source);
    const t = at.get(e.target);
    if (!s || !t) continue;
    // The edge runs from the source's bottom handle to the target's top handle; its label starts right of the midpoint.
    const midX = (s.x + t.x) / 2 + NODE_WIDTH / 2;
    const midY = (s.y + NODE_HEIGHT + t.y) / 2;
    const width = e.refused ? LABEL_MAX_WIDTH : Math.min(LABEL_MAX_WIDTH, e.text.length * CHAR_WIDTH + LABEL_PADDING);
    const half = (e.refused ? REFUSED_LABEL_HEIGHT : LABEL_HEIGHT) / 2;
    grow(midX, midY - half, midX + LABEL_OFFSET + width, midY + half);
  }
  return { x: left, y: top, width: right - left, height: bottom - top };
}
