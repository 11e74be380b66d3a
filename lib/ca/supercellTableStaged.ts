import { evolveCells, fromDigits, toDigits } from "./evolveCells";
import type { RuleTable } from "./ruleTable";

/** Largest segment table: k^L entries at most. */
const MAX_SEGMENT_ENTRIES = 2 ** 16;

type Segment = { fromPow: number; toPow: number; keep: number };
type Stage = { lookup: Uint16Array; modulus: number; segments: Segment[] };

/**
 * The supercell table for any alphabet by light-cone composition, with base-k arithmetic in place of bit
 * shifts: a window is the base-k number of its W cells; each stage covers the row with segment tables (the
 * middle cells of a segment after s steps); an overlapping last segment contributes only its new cells.
 * Returns null when segments cannot fit (then the plain definition is used). Tested against the plain table.
 */
export function supercellTableStaged(t: RuleTable, N: number, T: number, K: number, R: number, W: number, size: number): RuleTable | null {
  let Lmax = 0;
  while (t.k ** (Lmax + 1) <= MAX_SEGMENT_ENTRIES) Lmax++;
  if (W <= Lmax || Math.floor(Lmax / (4 * t.r)) < 1) return null;
  const stages = planStages(t, W, T, Lmax);
  const finalLength = W - 2 * t.r * T;
  const shiftPow = t.k ** (finalLength - (R * N - t.r * T) - N);
  const table = new Uint8Array(size);
  for (let w = 0; w < size; w++) {
    let row = w;
    for (const { lookup, modulus, segments } of stages) {
      let next = 0;
      for (const { fromPow, toPow, keep } of segments) next += (lookup[Math.floor(row / fromPow) % modulus] % keep) * toPow;
      row = next;
    }
    table[w] = Math.floor(row / shiftPow) % K;
  }
  return { k: K, r: R, table };
}

function planStages(t: RuleTable, W: number, T: number, Lmax: number): Stage[] {
  const stages: Stage[] = [];
  const cache = new Map<string, Uint16Array>();
  let length = W;
  let remaining = T;
  while (remaining > 0) {
    const L = Math.min(Lmax, length);
    const steps = length <= Lmax ? remaining : Math.min(remaining, Math.floor(Lmax / (4 * t.r)));
    const out = L - 2 * t.r * steps;
    const nextLength = length - 2 * t.r * steps;
    const key = `${L}:${steps}`;
    if (!cache.has(key)) cache.set(key, segmentTable(t, L, steps));
    const segments: Segment[] = [];
    for (let p = 0; p < nextLength; p += out) {
      const start = Math.min(p, nextLength - out);
      // Cells before p were written by the previous segment; keep only this segment's last nextLength − p… cells.
      const fresh = Math.min(out, nextLength - p);
      segments.push({ fromPow: t.k ** (length - start - L), toPow: t.k ** (nextLength - start - out), keep: t.k ** fresh });
    }
    stages.push({ lookup: cache.get(key)!, modulus: t.k ** L, segments });
    length = nextLength;
    remaining -= steps;
  }
  return stages;
}

function segmentTable(t: RuleTable, L: number, steps: number): Uint16Array {
  const lookup = new Uint16Array(t.k ** L);
  for (let v = 0; v < lookup.length; v++) lookup[v] = fromDigits(evolveCells(t, toDigits(v, t.k, L), steps), t.k);
  return lookup;
}
