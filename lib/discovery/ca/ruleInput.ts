import { CaInputError, assertRuleTable, ecaRuleOf, ecaTable, type RuleTable } from "@/lib/ca";
import { ecaSupercell, generalSupercell, type Supercell } from "./supercell";
import { wideSupercell } from "./wideSupercell";

/** A CA given by ECA rule number or rule table (as the core's builders take it). */
export interface RuleOption {
  rule?: number;
  table?: RuleTable | { k: number; r: number; table: ArrayLike<number> };
}

export interface ResolvedRule {
  table: RuleTable;
  /** Wolfram code when the CA is an ECA */
  eca: number | null;
  /** the supercell at block N with T steps (T defaults to N); radius ceil(rT / N) */
  supercell: (block: number, steps?: number) => Supercell;
}

/** Checks the rule input and the block size, and says how to build its supercell table for the search. */
export function resolveRule(input: RuleOption): ResolvedRule {
  if (input.rule !== undefined && input.table !== undefined) throw new CaInputError("rule", "give either a rule number or a table, not both");
  const table: RuleTable =
    input.rule !== undefined
      ? ecaTable(input.rule)
      : input.table
        ? { k: input.table.k, r: input.table.r, table: tableEntries(input.table.table) }
        : (() => {
            throw new CaInputError("rule", "a rule number or a rule table is required");
          })();
  assertRuleTable(table);
  const eca = ecaRuleOf(table);
  return {
    table,
    eca,
    supercell: (block, steps = block) => {
      if (steps !== block || table.r !== 1) return wideSupercell(table, block, steps);
      return eca !== null ? ecaSupercell(eca, block) : generalSupercell(table.k, table.table, block);
    },
  };
}

/** The table as bytes, refusing what Uint8Array.from would silently coerce ("1" → 1, "x" → 0, 1.5 → 1, −1 → 255). */
function tableEntries(entries: ArrayLike<unknown>): Uint8Array {
  const out = new Uint8Array(entries.length);
  for (let i = 0; i < entries.length; i++) {
    const v = entries[i];
    if (typeof v !== "number" || !Number.isInteger(v) || v < 0 || v > 255) throw new CaInputError("table", `entry ${i} is ${JSON.stringify(v)}, not a symbol (a whole number 0..k−1)`);
    out[i] = v;
  }
  return out;
}

/** Steps per coarse step: 1 … 2N (DOMAIN.md §2b); defaults to the block size. */
export function assertSteps(steps: unknown, block: number): asserts steps is number {
  if (typeof steps !== "number" || !Number.isInteger(steps) || steps < 1 || steps > 2 * block)
    throw new CaInputError("steps", `steps must be an integer from 1 to 2N = ${2 * block}, got ${String(steps)}`);
}

export function assertBlock(block: unknown, max: number): asserts block is number {
  if (typeof block !== "number" || !Number.isInteger(block) || block < 1 || block > max)
    throw new CaInputError("block", `block size must be an integer from 1 to ${max}, got ${String(block)}`);
}
