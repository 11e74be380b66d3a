import { pointOnCurve, type Curve } from "./edgeCurve";
import { boxesIntersect, type Box } from "./geometry";

export type LabelRequest = {
  id: string;
  text: string;
  curve: Curve;
  /** Higher goes first and so wins a contested place. @default 0 */
  priority?: number;
};

export type LabelPlacementOptions = {
  /** Advance of one character of the label font (monospace, 10 px: 0.6 em, plus a little room). @default 6.4 */
  charWidth?: number;
  /** @default 14 */
  height?: number;
  /** Inner room on the left and right of the text. @default 4 */
  padX?: number;
  /** Clear space kept between a label and anything else, on each side. @default 2 */
  margin?: number;
  /** Where along the curve a label may sit, tried in this order. @default [0.5, 0.4, 0.6, 0.3, 0.7, 0.22, 0.78, 0.15, 0.85] */
  along?: number[];
};

/** The size a label's box is drawn at; the drawing fixes the box to exactly this, so placement and page agree. */
export function labelSize(text: string, options: LabelPlacementOptions = {}): { width: number; height: number } {
  const { charWidth = 6.4, height = 14, padX = 4 } = options;
  return { width: Math.ceil(text.length * charWidth + 2 * padX), height };
}

/**
 * Places edge labels greedily (highest priority first, then shorter text, then id): each label tries
 * points along its own edge's curve and takes the first whose box meets no obstacle (the nodes) and
 * no label already placed. A label with no free place is left out of the result; the drawing shows it
 * only when its edge is picked out. Greedy fixed-candidate placement is the common practice for map
 * labels (Christensen, Marks & Shieber, ACM TOG 14, 203, 1995, compare it with better optimisers; reference recalled from memory).
 */
export function placeEdgeLabels(requests: LabelRequest[], obstacles: Box[], options: LabelPlacementOptions = {}): Map<string, Box> {
  const { margin = 2, along = [0.5, 0.4, 0.6, 0.3, 0.7, 0.22, 0.78, 0.15, 0.85] } = options;
  const order = [...requests].sort((a, b) => (b.priority ?? 0) - (a.priority ?? 0) || a.text.length - b.text.length || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const grid = new BoxGrid(64);
  for (const o of obstacles) grid.add(o);
  const placed = new Map<string, Box>();
  for (const request of order) {
    if (!request.text) continue;
    const { width, height } = labelSize(request.text, options);
    for (const t of along) {
      const at = pointOnCurve(request.curve, t);
      const box = { x: at.x - width / 2, y: at.y - height / 2, width, height };
      if (grid.near(box, margin).some((other) => boxesIntersect(box, other, margin))) continue;
      grid.add(box);
      placed.set(request.id, box);
      break;
    }
  }
  return placed;
}

/** A uniform grid of boxes, so that each test looks only at the boxes in the cells it covers. */
class BoxGrid {
  private readonly cells = new Map<string, Box[]>();
  constructor(private readonly size: number) {}

  private keys(box: Box, margin: number): string[] {
    const keys: string[] = [];
    const [x0, x1] = [Math.floor((box.x - margin) / this.size), Math.floor((box.x + box.width + margin) / this.size)];
    const [y0, y1] = [Math.floor((box.y - margin) / this.size), Math.floor((box.y + box.height + margin) / this.size)];
    for (let i = x0; i <= x1; i++) for (let j = y0; j <= y1; j++) keys.push(`${i},${j}`);
    return keys;
  }

  add(box: Box): void {
    for (const key of this.keys(box, 0)) this.cells.set(key, [...(this.cells.get(key) ?? []), box]);
  }

  /** Boxes in any cell that `box` grown by twice `margin` touches (a superset of those it can meet). */
  near(box: Box, margin: number): Box[] {
    return [...new Set(this.keys(box, 2 * margin).flatMap((key) => this.cells.get(key) ?? []))];
  }
}
