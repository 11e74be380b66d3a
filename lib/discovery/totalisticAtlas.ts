/**
 * Three-state totalistic radius-1 rules (DOMAIN.md §2b, common practice): the new value depends only on the sum
 * s = x₋₁ + x₀ + x₁ ∈ {0..6}; code c = Σ_s v(s)·3^s, so the value for sum s is base-3 digit s of c (digit 0 least
 * significant); 3^7 = 2,187 codes. The atlas lists, per code and block size (1: partitions of the three states;
 * 2: partitions of the nine block states), every proper congruence (searchAllCongruences).
 */
import { CaInputError, type RuleTable } from "@/lib/ca";
import { searchAllCongruences } from "./searchAllCongruences";
import type { Congruence } from "./searchCongruences";
import { coverageRecord, type Coverage } from "./coverage";
import { makeStopper, type LongRunOptions, type Stopped } from "./stopper";

export const TOTALISTIC_CODES = 3 ** 7;

/** The full rule table (index 9·x₋₁ + 3·x₀ + x₁, DOMAIN.md §1) of totalistic code c. */
export function totalisticTable(code: number): RuleTable {
  if (!Number.isInteger(code) || code < 0 || code >= TOTALISTIC_CODES)
    throw new CaInputError("code", `a three-state totalistic code is an integer in 0..${TOTALISTIC_CODES - 1}, got ${code}`);
  const digit = (s: number) => Math.floor(code / 3 ** s) % 3;
  const table = new Uint8Array(27);
  for (let i = 0; i < 27; i++) table[i] = digit(Math.floor(i / 9) + (Math.floor(i / 3) % 3) + (i % 3));
  return { k: 3, r: 1, table };
}

export interface TotalisticAtlasRow {
  code: number;
  block: number;
  /** every proper congruence, fewest classes first, maximal ones marked */
  congruences: Congruence[];
}

export interface TotalisticAtlas {
  stopped: Stopped;
  rows: TotalisticAtlasRow[];
  /** block sizes covered for every code */
  blocks: number[];
  coverage: Coverage;
}

export interface TotalisticAtlasOptions extends LongRunOptions {
  /** @default [1, 2] */
  blocks?: number[];
  /** @default every code 0 … 2186 */
  codes?: number[];
}

export function buildTotalisticAtlas(options: TotalisticAtlasOptions = {}): TotalisticAtlas {
  const blocks = options.blocks ?? [1, 2];
  for (const N of blocks) if (N !== 1 && N !== 2) throw new CaInputError("blocks", `the three-state atlas covers block sizes 1 and 2, got ${N}`);
  const codes = options.codes ?? Array.from({ length: TOTALISTIC_CODES }, (_, c) => c);
  const stop = makeStopper(options);
  const rows: TotalisticAtlasRow[] = [];
  const covered: number[] = [];
  const total = blocks.length * codes.length;
  for (const [b, N] of blocks.entries()) {
    for (const [i, code] of codes.entries()) {
      const item = `block ${N}, code ${code}`;
      if (i % 64 === 0) options.onProgress?.((b * codes.length + i) / total, item);
      const stopped = stop();
      if (stopped) return { stopped, rows, blocks: covered, coverage: coverageRecord("partitions", null, covered, stopped, item) };
      const search = searchAllCongruences({ table: totalisticTable(code), block: N, signal: options.signal });
      if (search.stopped) return { stopped: search.stopped, rows, blocks: covered, coverage: coverageRecord("partitions", null, covered, search.stopped, item) };
      if (search.congruences.length > 0) rows.push({ code, block: N, congruences: search.congruences });
    }
    covered.push(N);
  }
  options.onProgress?.(1, "done");
  return { stopped: null, rows, blocks: covered, coverage: coverageRecord("partitions", null, covered, null, null) };
}
