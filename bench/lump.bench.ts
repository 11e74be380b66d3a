/**
 * Coarsest strong lumping: splitter-based refinement (lib/discovery) on a sparse exact chain of 100,000 states
 * and 1,000,000 transitions, and against naive round-based refinement (every block re-split by full signatures
 * until stable) on a 10,000-state chain, measured in the same run.
 *
 * The chains lift a birth–death walk on a line of 1,000 blocks (10 or 100 states each) (½ left, ½ right, reflecting ends): every state of block I
 * spreads ½ over five states of block I − 1 and ½ over five of block I + 1 with random exact weights k/60. The
 * initial partition marks block 0 only, so distinctions travel one block per round of naive refinement.
 */
import { coarsestLumping, type SparseChain } from "@/lib/discovery";
import { rational, type Rational } from "@/lib/rational";
import { seededRandom } from "@/lib/random";

/** Five positive weights k/60 summing to 1. */
function fiveWeights(random: () => number): number[] {
  const cuts = new Set<number>();
  while (cuts.size < 4) cuts.add(1 + Math.floor(random() * 59));
  const bounds = [0, ...[...cuts].sort((a, b) => a - b), 60];
  return bounds.slice(1).map((b, i) => b - bounds[i]);
}

function liftedLine(blocks: number, perBlock: number, seed: number): { chain: SparseChain; labels: string[] } {
  const random = seededRandom(seed);
  const n = blocks * perBlock;
  const rowStart = new Int32Array(n + 1);
  const col: number[] = [];
  const value: Rational[] = [];
  const cache = new Map<number, Rational>();
  const exact = (k: number): Rational => {
    let r = cache.get(k);
    if (!r) cache.set(k, (r = rational(k, 120)));
    return r;
  };
  for (let i = 0; i < n; i++) {
    const I = Math.floor(i / perBlock);
    const row = new Map<number, number>();
    for (const J of [Math.max(I - 1, 0), Math.min(I + 1, blocks - 1)]) {
      const weights = fiveWeights(random);
      const picked = new Set<number>();
      while (picked.size < 5) picked.add(J * perBlock + Math.floor(random() * perBlock));
      [...picked].forEach((j, k) => row.set(j, (row.get(j) ?? 0) + weights[k]));
    }
    for (const [j, k] of [...row].sort((a, b) => a[0] - b[0])) {
      col.push(j);
      value.push(exact(k));
    }
    rowStart[i + 1] = col.length;
  }
  const labels = Array.from({ length: n }, (_, i) => (i < perBlock ? "watched" : "other"));
  return { chain: { size: n, rowStart, col: Int32Array.from(col), value }, labels };
}

/** Naive refinement: each round every state's signature (its block, and its sum into every block) re-splits all. */
function naiveRounds(chain: SparseChain, labels: string[]): { blocks: number; rounds: number } {
  const n = chain.size;
  const num = chain.value.map((v) => Number((v.num * 120n) / v.den));
  let block = Int32Array.from(labels, (l) => (l === labels[0] ? 0 : 1));
  let count = new Set(block).size;
  for (let rounds = 1; ; rounds++) {
    const ids = new Map<string, number>();
    const next = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const sums = new Map<number, number>();
      for (let e = chain.rowStart[i]; e < chain.rowStart[i + 1]; e++) sums.set(block[chain.col[e]], (sums.get(block[chain.col[e]]) ?? 0) + num[e]);
      const key = `${block[i]}|${[...sums].sort((a, b) => a[0] - b[0]).join(";")}`;
      let id = ids.get(key);
      if (id === undefined) ids.set(key, (id = ids.size));
      next[i] = id;
    }
    block = next;
    if (ids.size === count) return { blocks: count, rounds };
    count = ids.size;
  }
}

function seconds<T>(f: () => T): [T, number] {
  const t = process.cpuUsage();
  const result = f();
  const d = process.cpuUsage(t);
  return [result, (d.user + d.system) / 1e6];
}

export async function main(args: string[]): Promise<void> {
  const quick = args.includes("--quick");
  const small = liftedLine(1000, 10, 1);
  const [fastSmall, fastSmallTime] = seconds(() => coarsestLumping({ chain: small.chain, labels: small.labels }));
  const [naive, naiveTime] = seconds(() => naiveRounds(small.chain, small.labels));
  const agree = naive.blocks === fastSmall.blocks ? "same blocks" : `BLOCKS DIFFER (${naive.blocks} vs ${fastSmall.blocks})`;
  console.log(
    `lump 10,000 states / ${small.chain.col.length} transitions: splitter refinement ${fastSmallTime.toFixed(3)} s CPU, naive round-based ${naiveTime.toFixed(3)} s CPU (${naive.rounds} rounds), speed-up ${(naiveTime / fastSmallTime).toFixed(1)}x (${fastSmall.blocks} blocks, ${agree})`,
  );
  if (quick) return;
  const [big, buildTime] = seconds(() => liftedLine(1000, 100, 2));
  const wall = performance.now();
  const [fastBig, fastBigTime] = seconds(() => coarsestLumping({ chain: big.chain, labels: big.labels }));
  const wallBig = (performance.now() - wall) / 1000;
  console.log(
    `lump 100,000 states / ${big.chain.col.length} transitions (exact rationals, two-label start): ${fastBigTime.toFixed(2)} s CPU, ${wallBig.toFixed(2)} s wall, including the exact row-sum check (target < 20 s), ${fastBig.blocks} blocks; chain built in ${buildTime.toFixed(2)} s`,
  );
  console.log(`peak memory (max RSS): ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
}
