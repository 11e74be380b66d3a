import { CaInputError, type RuleTable } from "./ruleTable";
import { supercellTable } from "./supercellTable";

/**
 * The T-step iterate f^T as a CA of radius rT (DOMAIN.md §2, CA time decimation): it is exactly the
 * block-1 supercell table with T steps, whose radius is ceil(rT / 1) = rT.
 */
export function iterateTable(t: RuleTable, T: number): RuleTable {
  if (!Number.isInteger(T) || T < 1) throw new CaInputError("steps", `steps must be a positive integer, got ${T}`);
  return supercellTable(t, 1, T);
}
