export type Point = { x: number; y: number };

/** An axis-aligned box by its top-left corner, in drawing coordinates. */
export type Box = { x: number; y: number; width: number; height: number };

/** Whether two boxes share interior area once each is grown by `margin` on every side (touching edges do not count). */
export function boxesIntersect(a: Box, b: Box, margin = 0): boolean {
  return a.x - margin < b.x + b.width + margin && b.x - margin < a.x + a.width + margin && a.y - margin < b.y + b.height + margin && b.y - margin < a.y + a.height + margin;
}
