import { caShape, chainSize, type Model } from "@/lib/models";
import { gcd, parseRational } from "@/lib/rational";
import type { Certificate } from "@/lib/certificate";

/**
 * Bounds on the work one verification may do. The first six are sizes; the last five were added so
 * that every check is bounded before any work starts (the raw text, every number's digits, and the
 * predicted cost of states, steps and digits together). They are optional so that an older caller's
 * object still type-checks; a missing one takes its DEFAULT_LIMITS value.
 */
export type Limits = {
  /** Block size N of a supercell. */
  maxBlock: number;
  /** Alphabet of any CA involved, including a supercell's k^N. */
  maxAlphabet: number;
  /** States of a Markov chain (rows, and entries per row, counted on the raw input). */
  maxStates: number;
  /** Windows of an exhaustive check, and entries of any rule table built. */
  maxWindows: number;
  /** Decimal digits of a rational, given or (for matrix powers) predicted. */
  maxDigits: number;
  /** Steps T of a CA map or k of a decimation, each as written and multiplied out through nested models. */
  maxSteps: number;
  /** Decimal digits of the numerator or the denominator of any one rational, counted on the raw text before any arithmetic. */
  maxEntryDigits?: number;
  /** Predicted cost of a chain check (see chainCost), in digit operations. */
  maxChainCost?: number;
  /** Predicted cost of a CA check: windows × steps (see caCost). */
  maxCaCost?: number;
  /** Characters of a certificate's JSON text. */
  maxTextLength?: number;
  /** Nesting depth of arrays and objects in a certificate, refused before parsing. */
  maxNesting?: number;
};

export type Bound = keyof Limits;

export const DEFAULT_LIMITS: Required<Limits> = {
  maxBlock: 8,
  maxAlphabet: 256,
  maxStates: 200,
  maxWindows: 2 ** 24,
  maxDigits: 20_000,
  maxSteps: 4096,
  // A worst-case (Fibonacci) fraction of 1,000 digits reduces in about 3 ms; 10,000 digits took 52 s in an audit.
  maxEntryDigits: 1000,
  // Measured 8e-9 to 4e-8 ms per unit on a loaded 2-core machine (lib/verify/limits.test.ts names the cases): 10 to 40 s.
  maxChainCost: 1e12,
  // 2^24 windows at up to 64 steps; the block-8 check (2^24 windows × 8 steps) runs in under a second.
  maxCaCost: 2 ** 30,
  maxTextLength: 8_000_000,
  // The deepest valid certificate nests about 20 levels (16 nested models, a matrix); 64 leaves room and no stack risk.
  maxNesting: 64,
};

/** Every bound, the missing ones at their defaults. */
export function fullLimits(limits: Limits): Required<Limits> {
  return { ...DEFAULT_LIMITS, ...Object.fromEntries(Object.entries(limits).filter(([, v]) => v !== undefined)) } as Required<Limits>;
}

export type LimitExceeded = { bound: Bound; limit: number; asked: number };

type Ask = [bound: Bound, asked: number];

/** The first bound the certificate's check would exceed, or null; computes sizes only, never tables or powers. */
export function exceededLimit(cert: Certificate, limits: Limits): LimitExceeded | null {
  const all = fullLimits(limits);
  for (const [bound, asked] of asks(cert)) if (asked > all[bound]) return { bound, limit: all[bound], asked: Number.isFinite(asked) ? asked : Number.MAX_VALUE };
  return null;
}

/**
 * Predicted cost of P^s for an n-state chain whose entries have D digits after s steps (D = s × digits of
 * the common denominator): repeated squaring does about log2(s) + 1 matrix products of n³ multiplications,
 * the last ones on D-digit integers, and V8 multiplies large BigInts by Karatsuba's method, D^log2(3) ≈ D^1.6
 * (recalled from memory; the measured times fit it within a factor of 5, see limits.test.ts).
 */
export function chainCost(states: number, steps: number, digits: number): number {
  return states ** 3 * Math.max(1, digits) ** 1.6 * (Math.floor(Math.log2(Math.max(1, steps))) + 1);
}

/** Predicted cost of an exhaustive CA check: every window evolved T steps (the supercell table does no more). */
export function caCost(windows: number, steps: number): number {
  return windows * steps;
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
  if (map.kind === "iterate") {
    const windows = k ** (2 * r * map.steps + 1);
    out.push(["maxWindows", windows], ["maxCaCost", caCost(windows, map.steps)]);
  } else {
    const K = k ** map.block;
    const R = Math.ceil((r * map.steps) / map.block);
    const windows = K ** (2 * R + 1);
    out.push(["maxBlock", map.block], ["maxAlphabet", K], ["maxWindows", windows], ["maxCaCost", caCost(windows, map.steps)]);
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
      return [["maxBlock", model.block], ["maxSteps", model.steps], ...own, ["maxCaCost", caCost(k ** (2 * r + 1), model.steps)], ...caAsks(model.base)];
    case "iterate":
      return [["maxSteps", model.steps], ...own, ["maxCaCost", caCost(k ** (2 * r + 1), model.steps)], ...caAsks(model.base)];
    default:
      return own;
  }
}

/** States, steps, digits and cost of a chain-like model raised to `power`, the digits of P^s predicted as s·digits(D). */
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
  const n = chainSize(model);
  return [
    ["maxStates", n],
    ["maxSteps", power],
    ["maxDigits", Math.max(widest, predicted)],
    ["maxChainCost", power <= 1 ? 0 : chainCost(n, power, predicted)],
  ];
}
