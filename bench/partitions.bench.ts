/**
 * General-partition (congruence) sweep of all 256 ECAs: for each rule the smallest block size with a proper
 * coarse-graining, up to N = 7 (the published reach; Dzwinel & Magiera, J. Comput. Sci., 2015), then on to
 * N = 8 with progress. Baseline in the same run: plain enumeration of every
 * set partition of the block states at N = 3 (Bell(8) = 4,140 per rule; at N = 4 it would be Bell(16) ≈ 1.05·10^10).
 */
import { smallestBlockHeadline } from "@/cli/commands/atlas";
import { buildEcaAtlas, type PartitionAtlasRow } from "@/lib/discovery";
import { ecaSupercell } from "@/lib/discovery/ca/supercell";

function* setPartitions(n: number): Generator<number[]> {
  const rgs = new Array<number>(n).fill(0);
  function* visit(i: number, blocks: number): Generator<number[]> {
    if (i === n) {
      yield rgs;
      return;
    }
    for (let b = 0; b <= blocks; b++) {
      rgs[i] = b;
      yield* visit(i + 1, Math.max(blocks, b + 1));
    }
  }
  yield* visit(1, 1);
}

/** Plain: the smallest N ≤ maxBlock at which some proper partition of the block states is a congruence. */
function plainSmallestBlocks(maxBlock: number): (number | null)[] {
  const result: (number | null)[] = [];
  for (let rule = 0; rule < 256; rule++) {
    let smallest: number | null = null;
    for (let N = 2; N <= maxBlock && smallest === null; N++) {
      const { n, out } = ecaSupercell(rule, N);
      for (const p of setPartitions(n)) {
        const m = Math.max(...p) + 1;
        if (m === 1 || m === n) continue;
        const g = new Int32Array(m * m * m).fill(-1);
        let ok = true;
        for (let w = 0; w < n * n * n && ok; w++) {
          const idx = (p[Math.floor(w / (n * n))] * m + p[Math.floor(w / n) % n]) * m + p[w % n];
          if (g[idx] < 0) g[idx] = p[out[w]];
          else if (g[idx] !== p[out[w]]) ok = false;
        }
        if (ok) {
          smallest = N;
          break;
        }
      }
    }
    result.push(smallest);
  }
  return result;
}

function seconds<T>(f: () => T): [T, number] {
  const t = process.cpuUsage();
  const result = f();
  const d = process.cpuUsage(t);
  return [result, (d.user + d.system) / 1e6];
}

function noneClasses(rows: PartitionAtlasRow[]): number[] {
  return [...new Set(rows.filter((r) => r.block === null).map((r) => r.symmetryClass))].sort((a, b) => a - b);
}

export async function main(args: string[]): Promise<void> {
  const quick = args.includes("--quick");
  const [plain, plainTime] = seconds(() => plainSmallestBlocks(3));
  const [small, smallTime] = seconds(() => buildEcaAtlas({ kind: "partitions", maxBlock: 3 }));
  const agree = small.rows.every((r, i) => (r as PartitionAtlasRow).block === plain[i]) ? "same smallest blocks" : "SMALLEST BLOCKS DIFFER";
  console.log(`partitions N≤3, all 256 rules: search ${smallTime.toFixed(3)} s CPU, plain enumeration of all set partitions ${plainTime.toFixed(3)} s CPU, speed-up ${(plainTime / smallTime).toFixed(1)}x (${agree})`);
  const maxBlock = quick ? 5 : 7;
  const wall = performance.now();
  const [atlas, sweepTime] = seconds(() => buildEcaAtlas({ kind: "partitions", maxBlock }));
  const rows = atlas.rows as PartitionAtlasRow[];
  console.log(`partitions sweep N=2..${maxBlock}, all 256 rules: ${sweepTime.toFixed(1)} s CPU, ${((performance.now() - wall) / 1000).toFixed(1)} s wall (target < 600 s)`);
  console.log(smallestBlockHeadline(rows, maxBlock));
  if (quick) return;
  const none7 = noneClasses(rows);
  console.log(
    `Dzwinel & Magiera (J. Comput. Sci., 2015) report that at N = 7 the rules with no non-trivial coarse-graining stabilise at four inequivalent rules; this search: ${none7.length} classes (${none7.join(", ")})`,
  );
  // past the published reach: the same sweep continued to N = 8 (only rules still without a coarse-graining are searched there)
  let lastPrint = 0;
  const wall8 = performance.now();
  const [eight, time8] = seconds(() =>
    buildEcaAtlas({
      kind: "partitions",
      maxBlock: 8,
      onProgress: (fraction, item) => {
        if (!item.startsWith("block 8") || performance.now() - lastPrint < 2000) return;
        lastPrint = performance.now();
        console.log(`  N=8 progress ${(fraction * 100).toFixed(0)}% (${item})`);
      },
    }),
  );
  const rows8 = eight.rows as PartitionAtlasRow[];
  console.log(`partitions sweep N=2..8, all 256 rules: ${time8.toFixed(1)} s CPU, ${((performance.now() - wall8) / 1000).toFixed(1)} s wall`);
  console.log(smallestBlockHeadline(rows8, 8));
  console.log(`peak memory (max RSS): ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
}
