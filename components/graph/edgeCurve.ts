import type { Box, Point } from "./geometry";

/** A cubic Bézier curve: start, two control points, end. */
export type Curve = readonly [Point, Point, Point, Point];

/**
 * The curve an edge is drawn along, from the bottom middle of its source to the top middle of its
 * target (finer above, coarser below). The control points leave and enter vertically, half the
 * vertical distance away, and at least `minBend` away so that an edge within one band still bends.
 */
export function edgeCurve(source: Box, target: Box, minBend = 40): Curve {
  const start = { x: source.x + source.width / 2, y: source.y + source.height };
  const end = { x: target.x + target.width / 2, y: target.y };
  const bend = Math.max(minBend, (end.y - start.y) / 2);
  return [start, { x: start.x, y: start.y + bend }, { x: end.x, y: end.y - bend }, end];
}

/** The point at parameter t ∈ [0, 1] of a cubic Bézier curve (Bernstein form). */
export function pointOnCurve(curve: Curve, t: number): Point {
  const [p0, p1, p2, p3] = curve;
  const u = 1 - t;
  const a = u * u * u;
  const b = 3 * u * u * t;
  const c = 3 * u * t * t;
  const d = t * t * t;
  return { x: a * p0.x + b * p1.x + c * p2.x + d * p3.x, y: a * p0.y + b * p1.y + c * p2.y + d * p3.y };
}

/** The curve as an SVG path `d` attribute. */
export function curvePath(curve: Curve): string {
  const [p0, p1, p2, p3] = curve;
  const n = (v: number) => Math.round(v * 10) / 10;
  return `M ${n(p0.x)} ${n(p0.y)} C ${n(p1.x)} ${n(p1.y)}, ${n(p2.x)} ${n(p2.y)}, ${n(p3.x)} ${n(p3.y)}`;
}
