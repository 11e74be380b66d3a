import { MatrixInputError } from "./matrix";

/**
 * Renumbers blocks in order of first appearance (DOMAIN.md §1): [2, 2, 0, 1] → [0, 0, 1, 2].
 * Block labels are any non-negative integers; the result numbers blocks 0..B-1, every block non-empty.
 */
export function canonicalPartition(partition: readonly number[]): number[] {
  const renumber = new Map<number, number>();
  return partition.map((b, i) => {
    if (!Number.isSafeInteger(b) || b < 0) throw new MatrixInputError("partition", `entry ${i} is ${b}, not a block number ≥ 0`);
    if (!renumber.has(b)) renumber.set(b, renumber.size);
    return renumber.get(b)!;
  });
}

export function blockCount(partition: readonly number[]): number {
  return partition.reduce((m, b) => Math.max(m, b + 1), 0);
}
