/**
 * The smallest-block table of the ECA atlas (README, "N = 9"): for each rule, the smallest block size N with a proper
 * partition coarse-graining, read from the recorded congruence searches, or "none up to N" where a search found none.
 */
export type CongruenceRecordRow = { rule: number; modelId: string; coverage: string; outcome: string };
export type RuleCell = { rule: number; modelId: string; classes?: number };
export type SmallestBlockTable = {
  byBlock: { block: number; rules: RuleCell[] }[];
  none: { upTo: number; rules: RuleCell[] }[];
  unsearched: number[];
};

type Reading = { cell: RuleCell; found: number | null; upTo: number };

function parse(text: string): Record<string, unknown> {
  try {
    const value: unknown = JSON.parse(text);
    return value && typeof value === "object" ? (value as Record<string, unknown>) : {};
  } catch {
    return {};
  }
}

/** A record speaks for the smallest block only when it covered every block size from 2 up, at T = N (block 1 has no proper partition of two states). */
function readRecord(row: CongruenceRecordRow): Reading | null {
  const coverage = parse(row.coverage);
  // the table is of T = N coarse-grainings; a search with T steps apart answers another question
  if (coverage.steps !== undefined && coverage.steps !== "T = N") return null;
  const blocks = coverage.blocks;
  if (!Array.isArray(blocks) || blocks.length === 0 || !blocks.every((b, i) => b === i + 2)) return null;
  const outcome = parse(row.outcome);
  const upTo = blocks[blocks.length - 1] as number;
  const cell: RuleCell = { rule: row.rule, modelId: row.modelId };
  if (outcome.properCongruence !== true) return { cell, found: null, upTo };
  const smallest = typeof outcome.smallestBlock === "number" ? outcome.smallestBlock : upTo;
  if (typeof outcome.classes === "number") cell.classes = outcome.classes;
  return { cell, found: smallest, upTo };
}

/** Per rule, the smallest block any complete record found, else the widest "none up to N"; found beats none. */
function bestPerRule(rows: CongruenceRecordRow[]): Map<number, Reading> {
  const best = new Map<number, Reading>();
  for (const row of rows) {
    const r = readRecord(row);
    if (!r) continue;
    const had = best.get(row.rule);
    if (!had) best.set(row.rule, r);
    else if (r.found !== null && (had.found === null || r.found < had.found)) best.set(row.rule, r);
    else if (r.found === null && had.found === null && r.upTo > had.upTo) best.set(row.rule, r);
  }
  return best;
}

function grouped<K extends number>(entries: [K, RuleCell][]): Map<K, RuleCell[]> {
  const groups = new Map<K, RuleCell[]>();
  for (const [key, cell] of entries) groups.set(key, [...(groups.get(key) ?? []), cell]);
  for (const cells of groups.values()) cells.sort((a, b) => a.rule - b.rule);
  return groups;
}

export function smallestBlockTable(rows: CongruenceRecordRow[]): SmallestBlockTable {
  const best = bestPerRule(rows);
  const readings = [...best.values()];
  const found = grouped(readings.filter((r) => r.found !== null).map((r) => [r.found as number, r.cell]));
  const none = grouped(readings.filter((r) => r.found === null).map((r) => [r.upTo, r.cell]));
  return {
    byBlock: [...found].sort((a, b) => a[0] - b[0]).map(([block, rules]) => ({ block, rules })),
    none: [...none].sort((a, b) => b[0] - a[0]).map(([upTo, rules]) => ({ upTo, rules })),
    unsearched: Array.from({ length: 256 }, (_, rule) => rule).filter((rule) => !best.has(rule)),
  };
}
