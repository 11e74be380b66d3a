/**
 * The three-state totalistic atlas (lib/discovery, DOMAIN.md §2b numbering): all 2,187 codes at block size 2 (the
 * nine block states). Baseline in the same run: plain enumeration of all Bell(9) = 21,147 set partitions of the block
 * states, each checked window by window, on a sample of codes (the per-code ratio is reported); the search lists every
 * proper congruence, so the counts must agree code by code.
 */
import { buildTotalisticAtlas, totalisticTable, TOTALISTIC_CODES } from "@/lib/discovery";
import { supercellTable } from "@/lib/ca";

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

/** Number of proper set partitions of the nine block states that are congruences of code c's block-2 supercell. */
function plainCongruences(code: number): number {
  const F = supercellTable(totalisticTable(code), 2).table;
  const n = 9;
  let count = 0;
  for (const p of setPartitions(n)) {
    const m = Math.max(...p) + 1;
    if (m === 1 || m === n) continue;
    const g = new Int8Array(m * m * m).fill(-1);
    let ok = true;
    for (let w = 0; w < 729 && ok; w++) {
      const idx = (p[Math.floor(w / 81)] * m + p[Math.floor(w / 9) % 9]) * m + p[w % 9];
      if (g[idx] < 0) g[idx] = p[F[w]];
      else if (g[idx] !== p[F[w]]) ok = false;
    }
    if (ok) count++;
  }
  return count;
}

function cpu<T>(f: () => T): [T, number, number] {
  const t = process.cpuUsage();
  const w = performance.now();
  const result = f();
  const d = process.cpuUsage(t);
  return [result, (d.user + d.system) / 1e6, (performance.now() - w) / 1000];
}

export async function main(args: string[]): Promise<void> {
  const quick = args.includes("--quick");
  const sample = Array.from({ length: quick ? 20 : 100 }, (_, i) => Math.floor((i * TOTALISTIC_CODES) / (quick ? 20 : 100)));
  const [plain, plainTime] = cpu(() => sample.map(plainCongruences));
  const [sampled, sampleTime] = cpu(() => buildTotalisticAtlas({ blocks: [2], codes: sample }));
  const listed = (code: number) => sampled.rows.find((r) => r.code === code)?.congruences.length ?? 0;
  const agree = sample.every((code, i) => plain[i] === listed(code)) ? `same ${plain.reduce((a, b) => a + b, 0)} congruences` : "COUNTS DIFFER";
  console.log(
    `totalistic N=2, ${sample.length} sampled codes: search ${sampleTime.toFixed(3)} s CPU, plain enumeration of all 21,147 partitions ${plainTime.toFixed(2)} s CPU, speed-up ${(plainTime / sampleTime).toFixed(0)}x (${agree})`,
  );
  if (quick) return;
  const [atlas, time, wall] = cpu(() => buildTotalisticAtlas({ blocks: [1, 2] }));
  const at = (N: number) => atlas.rows.filter((r) => r.block === N);
  console.log(
    `totalistic atlas, all ${TOTALISTIC_CODES} codes at N=1 and N=2: ${time.toFixed(1)} s CPU, ${wall.toFixed(1)} s wall (target < 600 s); ${at(1).length} codes with a proper congruence at N=1, ${at(2).length} at N=2; ${atlas.rows.reduce((s, r) => s + r.congruences.length, 0)} proper congruences listed (every one); plain enumeration would take about ${((plainTime / sample.length) * TOTALISTIC_CODES).toFixed(0)} s CPU for N=2 alone`,
  );
}
