/** The partition editor's columns: each block in use (numbered from 0), and one empty column for a new block. */
export function partitionColumns(partition: number[]): { block: number; states: number[] }[] {
  const used = [...new Set(partition)].sort((a, b) => a - b);
  const fresh = used.length === 0 ? 0 : Math.max(...used) + 1;
  const columns = used.map((block) => ({ block, states: partition.flatMap((b, i) => (b === block ? [i] : [])) }));
  return fresh < partition.length ? [...columns, { block: fresh, states: [] }] : columns;
}

/** State `state` moved into `block` (a drop on that column); the other states keep their blocks. */
export function moveState(partition: number[], state: number, block: number): number[] {
  if (state < 0 || state >= partition.length || block < 0 || block >= partition.length) return partition;
  return partition.map((b, i) => (i === state ? block : b));
}
