import { supercellShape, supercellTablePlain } from "./supercellTablePlain";
import { supercellTableStaged } from "./supercellTableStaged";
import type { RuleTable } from "./ruleTable";

const SEGMENT = 16;
const LOW = 8;

/**
 * The block-N, T-step supercell table, fast. For binary rules a window is a bit string, and its evolution
 * is composed from light-cone tables: a table maps a segment of up to 16 cells to the middle cells after s
 * steps, and overlapping segments cover the row (N = T = 8: two lookups for 4 steps, then one for the next 4).
 * The tables themselves are built by plain stepping; tests compare the result with supercellTablePlain.
 */
export function supercellTable(t: RuleTable, N: number, T: number = N): RuleTable {
  const { K, R, W, size } = supercellShape(t, N, T);
  if (t.k !== 2 || W <= SEGMENT || W > 30 || 2 * t.r >= SEGMENT / 2)
    return (W > 30 || t.k !== 2 ? supercellTableStaged(t, N, T, K, R, W, size) : null) ?? supercellTablePlain(t, N, T);
  const stages = planStages(t, W, T);
  const table = new Uint8Array(size);
  const finalLength = W - 2 * t.r * T;
  const shift = finalLength - (R * N - t.r * T) - N;
  const mask = (1 << N) - 1;
  // Segments of the first stage that lie wholly above the low LOW bits are the same for 2^LOW windows in a row.
  const [first, ...later] = stages;
  const outer = first.segments.filter(([from]) => from >= LOW);
  const inner = first.segments.filter(([from]) => from < LOW);
  const innerFrom = Int32Array.from(inner, ([from]) => from);
  const innerTo = Int32Array.from(inner, ([, to]) => to);
  const lookups = later.map((s) => s.lookup);
  const masks = Int32Array.from(later, (s) => s.mask);
  const counts = Int32Array.from(later, (s) => s.segments.length);
  const froms = Int32Array.from(later.flatMap((s) => s.segments.map(([from]) => from)));
  const tos = Int32Array.from(later.flatMap((s) => s.segments.map(([, to]) => to)));
  const laterCount = later.length;
  const lowCount = 2 ** LOW;
  const firstLookup = first.lookup;
  const firstMask = first.mask;
  const innerCount = inner.length;
  if (innerCount === 1 && laterCount === 1 && counts[0] === 1) {
    // The common shape (N = T = 8 for r = 1): one lookup for the low segment, one for the last stage.
    const [inFrom, inTo, lastFrom, lastTo, lastMask, lastLookup] = [innerFrom[0], innerTo[0], froms[0], tos[0], masks[0], lookups[0]];
    for (let high = 0; high < size; high += lowCount) {
      let base = 0;
      for (const [from, to] of outer) base |= firstLookup[(high >>> from) & firstMask] << to;
      for (let w = high, end = high + lowCount; w < end; w++) {
        const row = base | (firstLookup[(w >>> inFrom) & firstMask] << inTo);
        table[w] = ((lastLookup[(row >>> lastFrom) & lastMask] << lastTo) >>> shift) & mask;
      }
    }
    return { k: K, r: R, table };
  }
  for (let high = 0; high < size; high += lowCount) {
    let base = 0;
    for (const [from, to] of outer) base |= firstLookup[(high >>> from) & firstMask] << to;
    for (let w = high, end = high + lowCount; w < end; w++) {
      let row = base;
      for (let j = 0; j < innerCount; j++) row |= firstLookup[(w >>> innerFrom[j]) & firstMask] << innerTo[j];
      for (let i = 0, j = 0; i < laterCount; i++) {
        const lookup = lookups[i];
        const segMask = masks[i];
        let next = 0;
        for (const stop = j + counts[i]; j < stop; j++) next |= lookup[(row >>> froms[j]) & segMask] << tos[j];
        row = next;
      }
      table[w] = (row >>> shift) & mask;
    }
  }
  return { k: K, r: R, table };
}

type Stage = { lookup: Uint16Array; mask: number; segments: [from: number, to: number][] };

/** Splits T steps into stages; each stage covers the current row with overlapping segments (bit shifts in and out). */
function planStages(t: RuleTable, W: number, T: number): Stage[] {
  const stages: Stage[] = [];
  const cache = new Map<string, Uint16Array>();
  let length = W;
  let remaining = T;
  while (remaining > 0) {
    const L = Math.min(SEGMENT, length);
    const steps = length <= SEGMENT ? remaining : Math.min(remaining, Math.floor(SEGMENT / (4 * t.r)));
    const out = L - 2 * t.r * steps;
    const nextLength = length - 2 * t.r * steps;
    const key = `${L}:${steps}`;
    if (!cache.has(key)) cache.set(key, segmentTable(t, L, steps));
    const segments: [number, number][] = [];
    for (let p = 0; p < nextLength; p += out) {
      const start = Math.min(p, nextLength - out);
      segments.push([length - start - L, nextLength - start - out]);
    }
    stages.push({ lookup: cache.get(key)!, mask: 2 ** L - 1, segments });
    length = nextLength;
    remaining -= steps;
  }
  return stages;
}

/** For every L-cell binary segment, the middle L - 2rs cells after s plain steps, as bits. */
function segmentTable(t: RuleTable, L: number, steps: number): Uint16Array {
  const lookup = new Uint16Array(2 ** L);
  const width = 2 * t.r + 1;
  const hood = 2 ** width - 1;
  for (let v = 0; v < lookup.length; v++) {
    let row = v;
    for (let s = 0, length = L; s < steps; s++, length -= 2 * t.r) {
      let next = 0;
      for (let i = 0; i + width <= length; i++) next = (next << 1) | t.table[(row >>> (length - width - i)) & hood];
      row = next;
    }
    lookup[v] = row;
  }
  return lookup;
}
