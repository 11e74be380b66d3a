/**
 * A Matrix Market coordinate file ("%%MatrixMarket matrix coordinate real|integer general", NIST format) read
 * straight into compressed rows, for chains far beyond the core's dense reader (a million states, ten million
 * transitions). Values are exact: decimals and p/q are parsed by the core's parseRational, once per distinct text.
 */
import { MatrixInputError } from "@/lib/markov";
import { parseRational, type Rational } from "@/lib/rational";
import type { SparseChain } from "./sparseChain";

export const MAX_SPARSE_STATES = 5_000_000;
const MAX_SPARSE_ENTRIES = 50_000_000;

const HEADER = /^%%MatrixMarket\s+matrix\s+coordinate\s+(real|integer)\s+general\s*$/i;

/** The whitespace-separated words of one line, without allocating a split array per line. */
function words(text: string, from: number, to: number): string[] {
  const out: string[] = [];
  let i = from;
  while (i < to) {
    while (i < to && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9 || text.charCodeAt(i) === 13)) i++;
    const start = i;
    while (i < to && text.charCodeAt(i) !== 32 && text.charCodeAt(i) !== 9 && text.charCodeAt(i) !== 13) i++;
    if (i > start) out.push(text.slice(start, i));
  }
  return out;
}

export function readSparseMatrixMarket(text: string): SparseChain {
  let pos = 0;
  let lineNo = 0;
  const nextLine = (): string[] | null => {
    while (pos < text.length) {
      let end = text.indexOf("\n", pos);
      if (end < 0) end = text.length;
      const from = pos;
      pos = end + 1;
      lineNo++;
      if (lineNo === 1) {
        if (!HEADER.test(text.slice(from, end).trim())) throw new MatrixInputError("line 1", "expected '%%MatrixMarket matrix coordinate real|integer general'");
        continue;
      }
      if (text.charCodeAt(from) === 37) continue; // a % comment
      const w = words(text, from, end);
      if (w.length > 0) return w;
    }
    return null;
  };
  const sizeLine = nextLine();
  if (!sizeLine) throw new MatrixInputError("matrix", "no size line");
  const [rows, cols, count] = sizeLine.map(Number);
  if (!(sizeLine.length === 3 && Number.isSafeInteger(rows) && rows > 0 && rows === cols && Number.isSafeInteger(count) && count >= 0))
    throw new MatrixInputError(`line ${lineNo}`, `expected "n n entries" for a square matrix, got "${sizeLine.join(" ")}"`);
  if (rows > MAX_SPARSE_STATES) throw new MatrixInputError(`line ${lineNo}`, `${rows} states is beyond ${MAX_SPARSE_STATES}`);
  if (count > MAX_SPARSE_ENTRIES) throw new MatrixInputError(`line ${lineNo}`, `${count} entries is beyond ${MAX_SPARSE_ENTRIES}`);
  const rowOf = new Int32Array(count);
  const colOf = new Int32Array(count);
  const valueOf = new Array<Rational>(count);
  const cache = new Map<string, Rational>();
  let k = 0;
  for (let w = nextLine(); w !== null; w = nextLine()) {
    if (k === count) throw new MatrixInputError(`line ${lineNo}`, `more entries than the ${count} announced`);
    const i = Number(w[0]) - 1;
    const j = Number(w[1]) - 1;
    if (w.length !== 3 || !(Number.isSafeInteger(i) && Number.isSafeInteger(j) && i >= 0 && j >= 0 && i < rows && j < rows))
      throw new MatrixInputError(`line ${lineNo}`, `expected "row column value" inside a ${rows}×${rows} matrix, got "${w.join(" ")}"`);
    let v = cache.get(w[2]);
    if (!v) {
      try {
        v = parseRational(w[2]);
      } catch (e) {
        throw new MatrixInputError(`line ${lineNo}`, e instanceof Error ? e.message : String(e));
      }
      cache.set(w[2], v);
    }
    rowOf[k] = i;
    colOf[k] = j;
    valueOf[k++] = v;
  }
  if (k !== count) throw new MatrixInputError("matrix", `announces ${count} entries, the file has ${k}`);
  return compress(rows, rowOf, colOf, valueOf);
}

/** Coordinate entries → rows sorted by column, zeros dropped, a repeated (row, column) refused. */
function compress(n: number, rowOf: Int32Array, colOf: Int32Array, valueOf: Rational[]): SparseChain {
  const rowStart = new Int32Array(n + 1);
  for (let k = 0; k < rowOf.length; k++) if (valueOf[k].num !== 0n) rowStart[rowOf[k] + 1]++;
  for (let i = 0; i < n; i++) rowStart[i + 1] += rowStart[i];
  const fill = rowStart.slice(0, n);
  const order = new Int32Array(rowStart[n]);
  for (let k = 0; k < rowOf.length; k++) if (valueOf[k].num !== 0n) order[fill[rowOf[k]]++] = k;
  const col = new Int32Array(order.length);
  const value = new Array<Rational>(order.length);
  for (let i = 0; i < n; i++) {
    const row = order.subarray(rowStart[i], rowStart[i + 1]).sort((a, b) => colOf[a] - colOf[b]);
    for (let e = 0; e < row.length; e++) {
      if (e > 0 && colOf[row[e]] === colOf[row[e - 1]]) throw new MatrixInputError("matrix", `entry (${i + 1}, ${colOf[row[e]] + 1}) is given twice`);
      col[rowStart[i] + e] = colOf[row[e]];
      value[rowStart[i] + e] = valueOf[row[e]];
    }
  }
  return { size: n, rowStart, col, value };
}
