/**
 * Radius-2 binary projection search (lib/discovery, block N with T = N steps, so the coarse radius is 2) against plain
 * enumeration of every projection, measured in the same run on the same random radius-2 rules. Two baselines:
 *  - plain: the supercell table built once (the core's supercellTable), then every one of the 2^(2^N) − 2 projections
 *    scanned window by window until its first conflict;
 *  - checker per projection: the core's checkProjection called on every projection (what a user without a search does).
 */
import { checkProjection, supercellTable, type RuleTable } from "@/lib/ca";
import { searchBinaryProjections } from "@/lib/discovery";

function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function cpu<T>(f: () => T): [T, number] {
  const t = process.cpuUsage();
  const result = f();
  const d = process.cpuUsage(t);
  return [result, (d.user + d.system) / 1e6];
}

function plainCount(t: RuleTable, N: number): number {
  const F = supercellTable(t, N, N);
  const n = F.k;
  const width = 2 * F.r + 1;
  let found = 0;
  const g = new Int8Array(2 ** width);
  for (let bits = 1; bits < 2 ** n - 1; bits++) {
    g.fill(-1);
    let ok = true;
    for (let w = 0; w < F.table.length && ok; w++) {
      let idx = 0;
      for (let i = width - 1, rest = w, scale = 1; i >= 0; i--, rest = Math.floor(rest / n), scale *= 2) idx += Math.floor(bits / 2 ** (rest % n)) % 2 * scale;
      const v = Math.floor(bits / 2 ** F.table[w]) % 2;
      if (g[idx] < 0) g[idx] = v;
      else if (g[idx] !== v) ok = false;
    }
    if (ok) found++;
  }
  return found;
}

function checkerCount(t: RuleTable, N: number): number {
  const n = 2 ** N;
  let found = 0;
  for (let bits = 1; bits < 2 ** n - 1; bits++) {
    const p = Array.from({ length: n }, (_, s) => Math.floor(bits / 2 ** s) % 2);
    if (checkProjection(t, N, p).ok) found++;
  }
  return found;
}

export async function main(args: string[]): Promise<void> {
  const quick = args.includes("--quick");
  const random = seeded(42);
  const rules: RuleTable[] = Array.from({ length: quick ? 3 : 10 }, () => ({ k: 2, r: 2, table: Uint8Array.from({ length: 32 }, () => (random() < 0.5 ? 0 : 1)) }));
  // rule 90's 2-step iterate x₋₂ XOR x₂ (DOMAIN.md §2b) has many projections: include it
  rules.push({ k: 2, r: 2, table: Uint8Array.from({ length: 32 }, (_, i) => ((i >> 4) & 1) ^ (i & 1)) });
  for (const N of [2, 3]) {
    const [searchTotal, searchTime] = cpu(() => rules.reduce((s, table) => s + searchBinaryProjections({ table, block: N }).targets.reduce((c, x) => c + Number(x.count), 0), 0));
    const [plainTotal, plainTime] = cpu(() => rules.reduce((s, t) => s + plainCount(t, N), 0));
    const [checkerTotal, checkerTime] = cpu(() => rules.reduce((s, t) => s + checkerCount(t, N), 0));
    const agree = searchTotal === plainTotal && plainTotal === checkerTotal ? "same counts" : `COUNTS DIFFER (${searchTotal}, ${plainTotal}, ${checkerTotal})`;
    console.log(
      `radius-2 projections N=${N} (T=${N}, coarse radius 2), ${rules.length} rules: search ${searchTime.toFixed(3)} s CPU; plain enumeration ${plainTime.toFixed(3)} s CPU (${(plainTime / searchTime).toFixed(1)}x); core checker per projection ${checkerTime.toFixed(3)} s CPU (${(checkerTime / searchTime).toFixed(1)}x); ${searchTotal} projections (${agree})${N === 3 ? "; target ≥ 50x at N = 3" : ""}`,
    );
  }
}
