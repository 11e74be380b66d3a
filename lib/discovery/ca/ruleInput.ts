import { CaInputError, assertRuleTable, ecaRuleOf, ecaTable, type RuleTable } from "@/lib/ca";
import { ecaSupercell, generalSupercell, type Supercell } from "./supercell";

/** A CA given by ECA rule number or rule table (as the core's builders take it). */
export interface RuleOption {
  rule?: number;
  table?: RuleTable | { k: number; r: number; table: ArrayLike<number> };
}

export interface ResolvedRule {
  table: RuleTable;
  /** Wolfram code when the CA is an ECA */
  eca: number | null;
  supercell: (block: number) => Supercell;
}

/** Checks the rule input and the block size, and says how to build its supercell table for the search. */
export function resolveRule(input: RuleOption): ResolvedRule {
  if (input.rule !== undefined && input.table !== undefined) throw new CaInputError("rule", "give either a rule number or a table, not both");
  const table: RuleTable =
    input.rule !== undefined
      ? ecaTable(input.rule)
      : input.table
        ? { k: input.table.k, r: input.table.r, table: Uint8Array.from(input.table.table) }
        : (() => {
            throw new CaInputError("rule", "a rule number or a rule table is required");
          })();
  assertRuleTable(table);
  if (table.r !== 1) throw new CaInputError("r", `the search handles radius-1 CAs; got radius ${table.r}`);
  const eca = ecaRuleOf(table);
  return {
    table,
    eca,
    supercell: (block) => (eca !== null ? ecaSupercell(eca, block) : generalSupercell(table.k, table.table, block)),
  };
}

export function assertBlock(block: unknown, max: number): asserts block is number {
  if (typeof block !== "number" || !Number.isInteger(block) || block < 1 || block > max)
    throw new CaInputError("block", `block size must be an integer from 1 to ${max}, got ${String(block)}`);
}
