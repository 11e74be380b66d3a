import { rationalDigits } from "@/lib/rational";
import { fullLimits, type Limits } from "./limits";
import { malformed, tooLarge, type Refusal } from "./refusal";

type Node = [value: unknown, depth: number, path: string];
const join = (path: string, key: string | number) => (path === "" ? String(key) : `${path}.${key}`);

/**
 * The bounds that can be read off a parsed JSON value before any arithmetic: nesting depth, every
 * steps, block and alphabet as written, sizes of matrices, partitions, projections and tables, the
 * digits of every rational (numerator and denominator, counted on its text) and the predicted cost of
 * reading a matrix. Works on a certificate and on a build request alike (they share field names).
 * Bounds that depend on several fields together (windows, steps multiplied through nested models,
 * the cost of P^s) are checked by exceededLimit once the bounded numbers have been read.
 */
export function rawInputRefusal(value: unknown, limits: Limits): Refusal | null {
  const all = fullLimits(limits);
  const stack: Node[] = [[value, 1, ""]];
  while (stack.length > 0) {
    const [node, depth, path] = stack.pop() as Node;
    if (typeof node !== "object" || node === null) continue;
    if (depth > all.maxNesting) return malformed(path, `nests deeper than ${all.maxNesting} levels of arrays and objects (maxNesting)`);
    if (Array.isArray(node)) {
      node.forEach((x, i) => typeof x === "object" && x !== null && stack.push([x, depth + 1, join(path, i)]));
      continue;
    }
    const obj = node as Record<string, unknown>;
    const refusal = fieldRefusal(obj, all) ?? (obj.kind === "markov" ? matrixRefusal(obj.matrix, all) : null);
    if (refusal) return refusal;
    for (const [key, x] of Object.entries(obj)) if (typeof x === "object" && x !== null) stack.push([x, depth + 1, join(path, key)]);
  }
  return null;
}

function fieldRefusal(obj: Record<string, unknown>, all: Required<Limits>): Refusal | null {
  const number = (key: string) => (typeof obj[key] === "number" ? (obj[key] as number) : 0);
  const length = (key: string) => (Array.isArray(obj[key]) || typeof obj[key] === "string" ? (obj[key] as unknown[]).length : 0);
  const asks: [keyof Limits, number][] = [
    ["maxSteps", number("steps")],
    ["maxBlock", number("block")],
    ["maxAlphabet", obj.kind === "ca" ? number("k") : 0],
    ["maxStates", length("partition")],
    ["maxStates", length("labels")],
    ["maxAlphabet", length("projection")],
    ["maxWindows", length("table")],
  ];
  for (const [bound, asked] of asks) if (asked > all[bound]) return tooLarge(bound, all[bound], asked);
  return null;
}

/**
 * Rows, row lengths and the digits of every entry of a raw matrix, then the predicted cost of reading
 * it: each entry is reduced (Euclid, e² for e digits) and each row summed over the common multiple L of
 * its denominators (L·e per entry); L's digits are at most the sum of the denominators' digits, taken
 * here over the distinct entries. So n²·(e² + L·e) digit operations at most.
 */
function matrixRefusal(matrix: unknown, all: Required<Limits>): Refusal | null {
  if (!Array.isArray(matrix)) return null;
  if (matrix.length > all.maxStates) return tooLarge("maxStates", all.maxStates, matrix.length);
  let widest = 1;
  let commonDigits = 0;
  const seen = new Set<string>();
  for (const row of matrix) {
    if (!Array.isArray(row)) continue;
    if (row.length > all.maxStates) return tooLarge("maxStates", all.maxStates, row.length);
    for (const entry of row) {
      if (typeof entry !== "string") continue;
      const digits = rationalDigits(entry);
      const e = digits ? Math.max(digits.num, digits.den) : entry.length;
      if (e > all.maxEntryDigits) return tooLarge("maxEntryDigits", all.maxEntryDigits, e);
      widest = Math.max(widest, e);
      if (digits && !seen.has(entry)) {
        seen.add(entry);
        commonDigits += digits.den;
      }
    }
  }
  const cost = matrix.length ** 2 * (widest ** 2 + commonDigits * widest);
  return cost > all.maxChainCost ? tooLarge("maxChainCost", all.maxChainCost, cost) : null;
}
