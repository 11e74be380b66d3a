/**
 * Radius-2 binary projection search (lib/discovery, block N with T = N steps, so the coarse radius is 2) against
 * plain enumeration of every projection, measured in the same run on the same random radius-2 rules.
 *
 * The baseline is plain enumeration as a person without a search would write it: every one of the 2^(2^N) − 2
 * projections in turn, each checked window by window in counting order, each window's centre block computed by
 * applying the fine rule T times to its (2R+1)N cells, stopping at the projection's first conflict. It builds no
 * table and shares nothing between projections. A second line gives the same enumeration over one supercell table
 * built once per rule by the core (lib/ca), which already borrows a search idea (evaluate each window once).
 *
 * Each side runs for a fixed stretch of CPU time after an uncounted warm-up stretch, and the CPU time per counted
 * run is reported. Counting by time, not by a fixed number of runs, gives the sub-millisecond search as long a
 * measurement as the baselines: with 100 counted runs (50 ms in all) the figure swung by ±30% with the JIT's and
 * the garbage collector's background threads, which process CPU time includes.
 */
import { supercellTable, type RuleTable } from "@/lib/ca";
import { searchBinaryProjections } from "@/lib/discovery";
import { seededRandom } from "@/lib/random";

/** Process CPU seconds since `start`. */
function cpuSince(start: NodeJS.CpuUsage): number {
  const d = process.cpuUsage(start);
  return (d.user + d.system) / 1e6;
}

/** CPU seconds per run of f, counted over at least `seconds` of CPU after `warmup` seconds of uncounted runs; f's result; the counted runs. */
function cpuPerRun<T>(warmup: number, seconds: number, f: () => T): [T, number, number] {
  const warm = process.cpuUsage();
  while (cpuSince(warm) < warmup) f();
  const start = process.cpuUsage();
  let result = f();
  let runs = 1;
  while (cpuSince(start) < seconds) {
    result = f();
    runs++;
  }
  return [result, cpuSince(start) / runs, runs];
}

/**
 * Plain enumeration for a binary rule: every projection, every window evolved from its fine cells, the first
 * conflict ending a projection. Windows, blocks and projections are bit strings, read with shifts.
 */
function plainCount(t: RuleTable, N: number, T: number): number {
  const { r, table } = t;
  const R = Math.ceil((r * T) / N);
  const width = 2 * R + 1;
  const cellsInWindow = width * N;
  const n = 2 ** N;
  const span = 2 * r + 1;
  const cells = new Uint8Array(cellsInWindow);
  const g = new Int8Array(2 ** width);
  const windows = 2 ** cellsInWindow;
  // the centre block X_0 is cells RN … RN+N−1; after T steps the row has lost rT cells on the left
  const first = R * N - r * T;
  let found = 0;
  for (let bits = 1; bits < 2 ** n - 1; bits++) {
    g.fill(-1);
    let ok = true;
    for (let w = 0; w < windows && ok; w++) {
      for (let i = 0; i < cellsInWindow; i++) cells[i] = (w >>> (cellsInWindow - 1 - i)) & 1;
      for (let s = 0, length = cellsInWindow; s < T; s++, length -= 2 * r)
        for (let i = 0; i + span <= length; i++) {
          let idx = 0;
          for (let d = 0; d < span; d++) idx = (idx << 1) | cells[i + d];
          cells[i] = table[idx];
        }
      let image = 0;
      for (let j = 0; j < N; j++) image = (image << 1) | cells[first + j];
      let c = 0;
      for (let b = width - 1; b >= 0; b--) c = (c << 1) | ((bits >>> ((w >>> (b * N)) & (n - 1))) & 1);
      const v = (bits >>> image) & 1;
      if (g[c] < 0) g[c] = v;
      else if (g[c] !== v) ok = false;
    }
    if (ok) found++;
  }
  return found;
}

/** The same enumeration over the core's supercell table, built once per rule. */
function sharedTableCount(t: RuleTable, N: number, T: number): number {
  const F = supercellTable(t, N, T);
  const n = F.k;
  const width = 2 * F.r + 1;
  let found = 0;
  const g = new Int8Array(2 ** width);
  for (let bits = 1; bits < 2 ** n - 1; bits++) {
    g.fill(-1);
    let ok = true;
    for (let w = 0; w < F.table.length && ok; w++) {
      let c = 0;
      for (let i = width - 1, rest = w, scale = 1; i >= 0; i--, rest = Math.floor(rest / n), scale *= 2) c += (Math.floor(bits / 2 ** (rest % n)) % 2) * scale;
      const v = Math.floor(bits / 2 ** F.table[w]) % 2;
      if (g[c] < 0) g[c] = v;
      else if (g[c] !== v) ok = false;
    }
    if (ok) found++;
  }
  return found;
}

export async function main(args: string[]): Promise<void> {
  const quick = args.includes("--quick");
  const random = seededRandom(42);
  const rules: RuleTable[] = Array.from({ length: quick ? 3 : 10 }, () => ({ k: 2, r: 2, table: Uint8Array.from({ length: 32 }, () => (random() < 0.5 ? 0 : 1)) }));
  // rule 90's 2-step iterate x₋₂ XOR x₂ (DOMAIN.md §2b) has many projections: include it
  rules.push({ k: 2, r: 2, table: Uint8Array.from({ length: 32 }, (_, i) => ((i >> 4) & 1) ^ (i & 1)) });
  // CPU seconds of warm-up and of counted runs, for each side
  const [warmup, seconds] = quick ? [0.05, 0.1] : [0.5, 1.5];
  for (const N of [2, 3]) {
    const count = (f: (t: RuleTable) => number) => rules.reduce((s, t) => s + f(t), 0);
    const [searchTotal, searchTime, searchRuns] = cpuPerRun(warmup, seconds, () =>
      count((table) => searchBinaryProjections({ table, block: N }).targets.reduce((c, x) => c + Number(x.count), 0)),
    );
    const [plainTotal, plainTime, plainRuns] = cpuPerRun(warmup, seconds, () => count((t) => plainCount(t, N, N)));
    const [sharedTotal, sharedTime, sharedRuns] = cpuPerRun(warmup, seconds, () => count((t) => sharedTableCount(t, N, N)));
    const agree = searchTotal === plainTotal && plainTotal === sharedTotal ? "same counts" : `COUNTS DIFFER (${searchTotal}, ${plainTotal}, ${sharedTotal})`;
    const ms = (s: number) => `${(s * 1000).toFixed(2)} ms`;
    console.log(
      `radius-2 projections N=${N} (T=${N}, coarse radius 2), ${rules.length} rules, CPU per run (each side counted over ≥ ${seconds} s after ${warmup} s of warm-up: search ${searchRuns} runs, plain ${plainRuns}, shared table ${sharedRuns}): ` +
        `search ${ms(searchTime)}; plain enumeration ${ms(plainTime)} (${(plainTime / searchTime).toFixed(1)}x); ` +
        `plain over one shared supercell table ${ms(sharedTime)} (${(sharedTime / searchTime).toFixed(1)}x); ${searchTotal} projections (${agree})${N === 3 ? "; target ≥ 50x over plain enumeration at N = 3" : ""}`,
    );
  }
}
