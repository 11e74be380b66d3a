import { ZERO, neg, parseRational, rationalDigits, RationalSyntaxError, type Rational } from "@/lib/rational";
import { MatrixInputError, type Matrix } from "./matrix";

export type ParseMatrixOptions = {
  /** Digits of any numerator or denominator, counted on the text before the number is read. @default Infinity */
  maxEntryDigits?: number;
};

function entry(text: string, where: string, options: ParseMatrixOptions = {}): Rational {
  const digits = rationalDigits(text);
  const bound = options.maxEntryDigits ?? Infinity;
  if (digits && Math.max(digits.num, digits.den) > bound)
    throw new MatrixInputError(where, `has ${Math.max(digits.num, digits.den)} digits; the bound is ${bound} (maxEntryDigits)`);
  try {
    return parseRational(text);
  } catch (e) {
    if (e instanceof RationalSyntaxError) throw new MatrixInputError(where, e.message);
    throw e;
  }
}

/** Dense CSV of rationals ("1/2", "0.25", "1"); blank lines and lines starting with # are skipped. */
export function parseCsvMatrix(text: string, options: ParseMatrixOptions = {}): Matrix {
  const rows: Matrix = [];
  text.split(/\r?\n/).forEach((line, index) => {
    const trimmed = line.trim();
    if (trimmed === "" || trimmed.startsWith("#")) return;
    rows.push(trimmed.split(",").map((cell, col) => entry(cell, `line ${index + 1}, column ${col + 1}`, options)));
  });
  if (rows.length === 0) throw new MatrixInputError("matrix", "no rows");
  const n = rows[0].length;
  rows.forEach((row, i) => {
    if (row.length !== n) throw new MatrixInputError("matrix", `row ${i + 1} has ${row.length} entries, row 1 has ${n}`);
  });
  return rows;
}

const HEADER = /^%%MatrixMarket\s+matrix\s+(coordinate|array)\s+(real|integer|pattern)\s+(general|symmetric|skew-symmetric)\s*$/i;

/**
 * Matrix Market exchange format (NIST, Boisvert, Pozo & Remington, "The Matrix Market Exchange Formats", 1996):
 * a %%MatrixMarket header, % comments, a size line, then 1-based "i j value" entries (coordinate) or values in
 * column-major order (array). Values are converted exactly; as an extension an entry may also be written p/q.
 */
export function parseMatrixMarket(text: string, options: ParseMatrixOptions = {}): Matrix {
  const lines = text.split(/\r?\n/);
  const header = HEADER.exec(lines[0]?.trim() ?? "");
  if (!header) throw new MatrixInputError("line 1", "expected '%%MatrixMarket matrix coordinate|array real|integer|pattern general|symmetric|skew-symmetric'");
  const [, layout, field, symmetry] = header.map((s) => s.toLowerCase());
  const body = lines
    .map((line, i) => ({ words: line.trim().split(/\s+/), where: `line ${i + 1}` }))
    .slice(1)
    .filter(({ words }) => words[0] !== "" && !words[0].startsWith("%"));
  if (body.length === 0) throw new MatrixInputError("matrix", "no size line");
  const [size, ...entries] = body;
  const dims = size.words.map(Number);
  const rows = dims[0];
  const cols = dims[1];
  if (!(dims.every((d) => Number.isSafeInteger(d) && d >= 0) && rows > 0 && rows === cols))
    throw new MatrixInputError(size.where, `expected the size of a square matrix, got "${size.words.join(" ")}"`);
  if (rows > 100_000) throw new MatrixInputError(size.where, `${rows} rows is beyond what the core reads`);
  const m: Matrix = Array.from({ length: rows }, () => new Array<Rational>(cols).fill(ZERO));
  const set = (i: number, j: number, v: Rational) => {
    m[i][j] = v;
    if (symmetry === "symmetric" && i !== j) m[j][i] = v;
    if (symmetry === "skew-symmetric" && i !== j) m[j][i] = neg(v);
  };
  if (layout === "array") {
    if (field === "pattern") throw new MatrixInputError("line 1", "an array matrix cannot be a pattern");
    const cells: [number, number][] = [];
    for (let j = 0; j < cols; j++)
      for (let i = symmetry === "general" ? 0 : symmetry === "symmetric" ? j : j + 1; i < rows; i++) cells.push([i, j]);
    if (entries.length !== cells.length) throw new MatrixInputError("matrix", `expected ${cells.length} values, got ${entries.length}`);
    entries.forEach(({ words, where }, index) => set(cells[index][0], cells[index][1], entry(words[0], where, options)));
    return m;
  }
  if (entries.length !== dims[2]) throw new MatrixInputError(size.where, `announces ${dims[2]} entries, the file has ${entries.length}`);
  for (const { words, where } of entries) {
    const i = Number(words[0]) - 1;
    const j = Number(words[1]) - 1;
    if (!(Number.isSafeInteger(i) && Number.isSafeInteger(j) && i >= 0 && j >= 0 && i < rows && j < cols))
      throw new MatrixInputError(where, `index (${words[0]}, ${words[1]}) is outside a ${rows}×${cols} matrix`);
    const value = field === "pattern" ? { num: 1n, den: 1n } : words[2] === undefined ? null : entry(words[2], where, options);
    if (value === null) throw new MatrixInputError(where, "missing value");
    set(i, j, value);
  }
  return m;
}
