/** A rational "p/q" or "p" as a floating-point number, for shading only (never for a check). */
export function approximate(value: string): number {
  const [p, q = "1"] = value.split("/");
  const num = Number(p);
  const den = Number(q);
  return Number.isFinite(num) && Number.isFinite(den) && den !== 0 ? num / den : 0;
}

/**
 * The order in which a heat map lists states: grouped by block of the partition (blocks in order,
 * states in their order within a block), and where each block ends so its outline can be drawn.
 */
export function blockOrder(partition: number[] | null, n: number): { order: number[]; ends: Set<number> } {
  if (!partition) return { order: Array.from({ length: n }, (_, i) => i), ends: new Set() };
  const blocks = Math.max(...partition) + 1;
  const order: number[] = [];
  const ends = new Set<number>();
  for (let b = 0; b < blocks; b++) {
    for (let i = 0; i < n; i++) if (partition[i] === b) order.push(i);
    ends.add(order.length - 1);
  }
  ends.delete(n - 1);
  return { order, ends };
}
