import { CaInputError, type RuleTable } from "./ruleTable";
import { supercellTable } from "./supercellTable";

/**
 * The T-step iterate f^T as a CA of radius rT (DOMAIN.md §2, CA time decimation): it is exactly the
 * block-1 supercell table with T steps, whose radius is ceil(rT / 1) = rT.
 */
export function iterateTable(t: RuleTable, T: number): RuleTable {
  if (!Number.isInteger(T) || T < 1) throw new CaInputError("steps", `steps must be a positive integer, got ${T}`);
  try {
    return supercellTable(t, 1, T);
  } catch (e) {
    // The supercell is of block 1, so what made the table too large is the number of steps.
    if (e instanceof CaInputError && e.field === "block") throw new CaInputError("steps", `the ${T}-step iterate is too large: ${e.message.replace(/^block: /, "")}`);
    throw e;
  }
}
