/**
 * Plain references for the discovery tests: straightforward enumeration over the core's own supercell table
 * (lib/ca, not the search's), so the fast searches are checked against code that shares nothing with them.
 */
import { ecaTable, supercellTable } from "@/lib/ca";

/** Every binary projection (both symbols used) of ECA `rule` at block N, counted by commuting target. */
export function plainProjectionCounts(rule: number, N: number): Map<number, number> {
  const F = supercellTable(ecaTable(rule), N).table;
  const n = 2 ** N;
  const counts = new Map<number, number>();
  for (let p = 1; p < 2 ** n - 1; p++) {
    const g = new Array<number>(8).fill(-1);
    let ok = true;
    for (let a = 0, w = 0; a < n && ok; a++)
      for (let b = 0; b < n && ok; b++)
        for (let c = 0; c < n && ok; c++, w++) {
          const idx = 4 * ((p >> a) & 1) + 2 * ((p >> b) & 1) + ((p >> c) & 1);
          const v = (p >> F[w]) & 1;
          if (g[idx] < 0) g[idx] = v;
          else if (g[idx] !== v) ok = false;
        }
    if (!ok) continue;
    const target = g.reduce((t, bit, m) => t | (bit << m), 0);
    counts.set(target, (counts.get(target) ?? 0) + 1);
  }
  return counts;
}

/** All set partitions of {0..n-1} as restricted growth strings (canonical form). */
export function* setPartitions(n: number): Generator<number[]> {
  const rgs = new Array<number>(n).fill(0);
  function* visit(i: number, blocks: number): Generator<number[]> {
    if (i === n) {
      yield rgs.slice();
      return;
    }
    for (let b = 0; b <= blocks; b++) {
      rgs[i] = b;
      yield* visit(i + 1, Math.max(blocks, b + 1));
    }
  }
  yield* visit(1, 1);
}

/** Whether a partition of the block states of ECA `rule` at block N is a congruence (plain check). */
export function isCongruence(F: ArrayLike<number>, n: number, partition: number[]): boolean {
  const m = Math.max(...partition) + 1;
  const g = new Array<number>(m * m * m).fill(-1);
  for (let w = 0; w < n * n * n; w++) {
    const idx = (partition[Math.floor(w / (n * n))] * m + partition[Math.floor(w / n) % n]) * m + partition[w % n];
    const v = partition[F[w]];
    if (g[idx] < 0) g[idx] = v;
    else if (g[idx] !== v) return false;
  }
  return true;
}

export { seededRandom } from "@/lib/random";
