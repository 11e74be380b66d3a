import { MatrixInputError, parseMatrixMarket } from "@/lib/markov";
import { add, compare, formatRational, ONE, parseRational, ZERO, type Rational } from "@/lib/rational";

/** A problem in typed or uploaded matrix text, at a 1-based line and column when it is at one cell. */
export type MatrixTextIssue = { line: number | null; column: number | null; message: string };

export type MatrixText = { ok: true; matrix: string[][] } | { ok: false; issues: MatrixTextIssue[] };

const MAX_STATES = 200;

/**
 * Reads a transition matrix typed or pasted by a person, or uploaded as CSV or Matrix Market: one row
 * per line, cells separated by commas, semicolons, tabs or spaces; entries exact ("1/3") or decimal
 * ("0.25", converted exactly, never through floating point). Blank lines and lines starting with #
 * are skipped. Every bad cell is named by its line and column.
 */
export function parseMatrixText(text: string): MatrixText {
  if (/^\s*%%MatrixMarket/i.test(text)) return fromMatrixMarket(text);
  const issues: MatrixTextIssue[] = [];
  const rows: { line: number; cells: Rational[] }[] = [];
  text.split(/\r?\n/).forEach((raw, index) => {
    const line = raw.trim();
    if (line === "" || line.startsWith("#")) return;
    const cells = line.split(line.includes(",") || line.includes(";") ? /\s*[,;]\s*/ : /\s+/);
    const values: Rational[] = [];
    cells.forEach((cell, col) => {
      try {
        values.push(parseRational(cell));
      } catch {
        issues.push({ line: index + 1, column: col + 1, message: `"${cell.slice(0, 30)}" is not an exact number such as 1/3 or 0.25` });
      }
    });
    rows.push({ line: index + 1, cells: values });
  });
  if (issues.length > 0) return { ok: false, issues };
  if (rows.length === 0) return { ok: false, issues: [{ line: null, column: null, message: "Type or upload at least one row." }] };
  if (rows.length > MAX_STATES) return { ok: false, issues: [{ line: null, column: null, message: `At most ${MAX_STATES} states here; this has ${rows.length}.` }] };
  return checkRows(rows);
}

function fromMatrixMarket(text: string): MatrixText {
  try {
    const m = parseMatrixMarket(text);
    if (m.length > MAX_STATES) return { ok: false, issues: [{ line: null, column: null, message: `At most ${MAX_STATES} states here; this has ${m.length}.` }] };
    return checkRows(m.map((cells, i) => ({ line: null, cells, row: i })));
  } catch (e) {
    if (e instanceof MatrixInputError) {
      const at = /^line (\d+)/.exec(e.field);
      return { ok: false, issues: [{ line: at ? Number(at[1]) : null, column: null, message: e.message }] };
    }
    throw e;
  }
}

/** Square, no negative entry, every row summing to exactly 1: each failing row named with its sum. */
function checkRows(rows: { line: number | null; cells: Rational[] }[]): MatrixText {
  const n = rows.length;
  const issues: MatrixTextIssue[] = [];
  rows.forEach(({ line, cells }, i) => {
    if (cells.length !== n) {
      issues.push({ line, column: null, message: `Row ${i + 1} has ${cells.length} entries; a ${n}-state chain needs ${n}.` });
      return;
    }
    cells.forEach((c, j) => {
      if (c.num < 0n) issues.push({ line, column: j + 1, message: `Entry (${i + 1}, ${j + 1}) is negative (${formatRational(c)}).` });
    });
    const sum = cells.reduce(add, ZERO);
    if (compare(sum, ONE) !== 0) issues.push({ line, column: null, message: `Row ${i + 1} sums to ${formatRational(sum)}, not 1.` });
  });
  if (issues.length > 0) return { ok: false, issues };
  return { ok: true, matrix: rows.map((r) => r.cells.map(formatRational)) };
}

/** "line 3, column 2: …" — how an issue reads next to the field. */
export function issueText(issue: MatrixTextIssue): string {
  const where = issue.line === null ? "" : issue.column === null ? `Line ${issue.line}: ` : `Line ${issue.line}, column ${issue.column}: `;
  return `${where}${issue.message}`;
}
