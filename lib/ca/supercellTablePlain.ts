import { evolveCells, fromDigits, toDigits } from "./evolveCells";
import { CaInputError, MAX_TABLE_ENTRIES, assertRuleTable, supercellRadius, type RuleTable } from "./ruleTable";

/**
 * The block-N, T-step supercell table by the definition (DOMAIN.md §2): every window of (2R+1)N cells
 * is evolved T steps and the centre block read off. Slow and obviously right; the reference for supercellTable.
 */
export function supercellTablePlain(t: RuleTable, N: number, T: number = N): RuleTable {
  const { K, R, W, size } = supercellShape(t, N, T);
  const table = new Uint8Array(size);
  const offset = R * N - t.r * T;
  for (let w = 0; w < size; w++) {
    const row = evolveCells(t, toDigits(w, t.k, W), T);
    table[w] = fromDigits(row, t.k, offset, offset + N);
  }
  return { k: K, r: R, table };
}

export function supercellShape(t: RuleTable, N: number, T: number): { K: number; R: number; W: number; size: number } {
  assertRuleTable(t);
  if (!Number.isInteger(N) || N < 1) throw new CaInputError("block", `block size must be a positive integer, got ${N}`);
  if (!Number.isInteger(T) || T < 1) throw new CaInputError("steps", `steps must be a positive integer, got ${T}`);
  const K = t.k ** N;
  if (K > 256) throw new CaInputError("block", `supercell alphabet k^N = ${K} exceeds 256`);
  const R = supercellRadius(t.r, N, T);
  const W = (2 * R + 1) * N;
  const size = t.k ** W;
  if (size > MAX_TABLE_ENTRIES) throw new CaInputError("block", `supercell table of ${t.k}^${W} entries exceeds ${MAX_TABLE_ENTRIES}`);
  return { K, R, W, size };
}
