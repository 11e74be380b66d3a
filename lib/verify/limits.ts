import { caShape, chainSize, type Model } from "@/lib/models";
import { gcd, parseRational } from "@/lib/rational";
import type { Certificate } from "@/lib/certificate";

/** Bounds on the work one verification may do; checked before any work starts. */
export type Limits = {
  /** Block size N of a supercell. */
  maxBlock: number;
  /** Alphabet of any CA involved, including a supercell's k^N. */
  maxAlphabet: number;
  /** States of a Markov chain. */
  maxStates: number;
  /** Windows of an exhaustive check, and entries of any rule table built. */
  maxWindows: number;
  /** Decimal digits of a rational, given or (for matrix powers) predicted. */
  maxDigits: number;
  /** Steps T of a CA map or k of a decimation. */
  maxSteps: number;
};

export const DEFAULT_LIMITS: Limits = {
  maxBlock: 8,
  maxAlphabet: 256,
  maxStates: 200,
  maxWindows: 2 ** 24,
  maxDigits: 20_000,
  maxSteps: 4096,
};

export type LimitExceeded = { bound: keyof Limits; limit: number; asked: number };

type Ask = [bound: keyof Limits, asked: number];

/** The first bound the certificate's check would exceed, or null; computes sizes only, never tables or powers. */
export function exceededLimit(cert: Certificate, limits: Limits): LimitExceeded | null {
  for (const [bound, asked] of asks(cert)) if (asked > limits[bound]) return { bound, limit: limits[bound], asked: Number.isFinite(asked) ? asked : Number.MAX_VALUE };
  return null;
}

function asks(cert: Certificate): Ask[] {
  const { map, source, target } = cert;
  const out: Ask[] = [];
  if (map.kind === "lumping" || map.kind === "exact-lumping" || map.kind === "decimation") {
    out.push(...chainAsks(source, map.steps), ...chainAsks(target, 1));
    return out;
  }
  out.push(...caAsks(source), ...caAsks(target), ["maxSteps", map.steps]);
  const { k, r } = caShape(source);
  if (map.kind === "iterate") out.push(["maxWindows", k ** (2 * r * map.steps + 1)]);
  else {
    const K = k ** map.block;
    const R = Math.ceil((r * map.steps) / map.block);
    out.push(["maxBlock", map.block], ["maxAlphabet", K], ["maxWindows", K ** (2 * R + 1)]);
  }
  return out;
}

/** Sizes of building a CA-like model's table, derived models included. */
function caAsks(model: Model): Ask[] {
  const { k, r } = caShape(model);
  const own: Ask[] = [
    ["maxAlphabet", k],
    ["maxWindows", k ** (2 * r + 1)],
  ];
  switch (model.kind) {
    case "supercell":
      return [["maxBlock", model.block], ["maxSteps", model.steps], ...own, ...caAsks(model.base)];
    case "iterate":
      return [["maxSteps", model.steps], ...own, ...caAsks(model.base)];
    default:
      return own;
  }
}

/** States, steps and digits of a chain-like model raised to `power`, the digits of P^s predicted as s·digits(D). */
function chainAsks(model: Model, power: number): Ask[] {
  if (model.kind === "decimated") return chainAsks(model.base, power * model.steps);
  if (model.kind !== "markov") return [];
  let widest = 0;
  let common = 1n;
  for (const row of model.matrix)
    for (const entry of row) {
      widest = Math.max(widest, entry.length);
      const den = parseRational(entry).den;
      common = (common / gcd(common, den)) * den;
    }
  const predicted = power <= 1 ? widest : power * common.toString().length;
  return [
    ["maxStates", chainSize(model)],
    ["maxSteps", power],
    ["maxDigits", Math.max(widest, predicted)],
  ];
}
