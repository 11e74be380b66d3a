import type { Limits } from "@/lib/verify";

/**
 * Sizes read off a submitted JSON value without any arithmetic on it (lengths and counts only), so
 * that they can be checked on the request thread before the payload goes anywhere. The worker then
 * does the arithmetic within the core's own limits.
 */
export type PayloadSize = {
  /** Decimal digits of the longest numeric string (numerator and denominator together). */
  maxDigits: number;
  /** The path of that string, for the error's `field`. */
  maxDigitsAt: string;
  /** Σ digits² over numeric strings: the work of reducing every rational to lowest terms (Euclid is quadratic). */
  reduceCost: number;
  /** States of the largest `matrix`. */
  states: number;
  /** Product of every `steps` field: the power a chain is raised to. */
  steps: number;
  /** Largest single `steps`, `block`, `k` and `r`: the shape of a CA check. */
  maxSteps: number;
  block: number;
  k: number;
  r: number;
  /**
   * Largest `k` inside a `source` (a certificate's source model), or null when there is none: the windows of a
   * CA check are words over the source's alphabet. A congruence onto 31 classes has a target with k = 31, yet
   * its check at block 5 reads 2^15 windows, not 31^15.
   */
  sourceK: number | null;
  /** Deepest nesting of arrays and objects. */
  depth: number;
};

/** What a server-side check may cost, beyond the core's bound on each dimension (see `predictedCost`). */
export const SERVER_BOUNDS = {
  /** Digits of one rational as submitted (the core checks the same, `maxEntryDigits`). */
  maxEntryDigits: 1000,
  /** Nesting of the submitted JSON. */
  maxNesting: 64,
  /** Predicted cost units of one check; see `predictedCost`. */
  maxCost: 20_000_000,
  /** Below these a check is "small" and may use the fast lane. */
  smallCost: 500_000,
  smallReduceCost: 2_000_000_000,
} as const;

const NUMERIC = /^[+-]?[0-9][0-9./eE+-]*$/;
const IN_SOURCE = /(^|\.)source\./;

/** One pass over the value (iterative, so depth cannot overflow the stack). */
export function payloadSize(value: unknown): PayloadSize {
  const size: PayloadSize = { maxDigits: 0, maxDigitsAt: "", reduceCost: 0, states: 0, steps: 1, maxSteps: 1, block: 1, k: 2, r: 1, sourceK: null, depth: 0 };
  const stack: { v: unknown; path: string; depth: number; key: string }[] = [{ v: value, path: "", depth: 0, key: "" }];
  while (stack.length > 0) {
    const { v, path, depth, key } = stack.pop()!;
    if (typeof v === "string") {
      if (v.length > 0 && NUMERIC.test(v)) {
        const digits = countDigits(v);
        size.reduceCost += digits * digits;
        if (digits > size.maxDigits) Object.assign(size, { maxDigits: digits, maxDigitsAt: path });
      }
      continue;
    }
    if (typeof v === "number") {
      if (!Number.isFinite(v)) continue;
      if (key === "steps" && v > 1) size.steps = Math.min(size.steps * v, Number.MAX_SAFE_INTEGER);
      if (key === "steps" || key === "block" || key === "k" || key === "r") {
        const field = key === "steps" ? "maxSteps" : key;
        size[field] = Math.max(size[field], v);
        if (key === "k" && IN_SOURCE.test(path)) size.sourceK = Math.max(size.sourceK ?? 2, v);
      }
      continue;
    }
    if (v === null || typeof v !== "object") continue;
    size.depth = Math.max(size.depth, depth + 1);
    if (depth + 1 > SERVER_BOUNDS.maxNesting) continue;
    if (key === "matrix" && Array.isArray(v)) size.states = Math.max(size.states, v.length);
    // a source without a `k` (an ECA) is binary
    if (key === "source") size.sourceK = Math.max(size.sourceK ?? 2, 2);
    for (const [k, child] of Object.entries(v)) stack.push({ v: child, path: path ? `${path}.${k}` : k, depth: depth + 1, key: k });
  }
  return size;
}

function countDigits(s: string): number {
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c >= 48 && c <= 57) n++;
  }
  return n;
}

/**
 * Predicted cost units of checking an n-state chain at power s: one pass over the n² entries, and
 * for s > 1 the ⌈log₂(s+1)⌉ products of n×n matrices of repeated squaring, each n³ multiplications
 * of entries that grow to about s·d digits. Entries are counted in words of 64 digits (a product of
 * w-word numbers costs about w²). Measured on a 2-core development machine: 10⁶ units take roughly
 * 0.1–0.5 s, so the bound `maxCost` is some seconds of work.
 */
export function predictedCost({ states, steps, maxDigits }: Pick<PayloadSize, "states" | "steps" | "maxDigits">): number {
  if (states === 0) return 0;
  const words = Math.max(1, (steps * Math.max(1, maxDigits)) / 64);
  const products = steps > 1 ? states * Math.ceil(Math.log2(steps + 1)) : 1;
  return states ** 2 * products * words * words;
}

export type SizeRefusal = { status: 413 | 400; bound: string; limit: number; asked: number; field: string };

/** The first server bound the payload exceeds, or null. Sizes only; the core checks the rest. */
export function exceededServerBound(size: PayloadSize, sizes: Limits, field: string): SizeRefusal | null {
  if (size.depth > SERVER_BOUNDS.maxNesting) return { status: 400, bound: "maxNesting", limit: SERVER_BOUNDS.maxNesting, asked: size.depth, field };
  if (size.maxDigits > SERVER_BOUNDS.maxEntryDigits) {
    return { status: 413, bound: "maxEntryDigits", limit: SERVER_BOUNDS.maxEntryDigits, asked: size.maxDigits, field: size.maxDigitsAt ? `${field}.${size.maxDigitsAt}` : field };
  }
  if (size.states > sizes.maxStates) return { status: 413, bound: "maxStates", limit: sizes.maxStates, asked: size.states, field };
  // A chain is raised to the product of its steps; a CA map's steps are bounded one by one.
  const steps = size.states > 0 ? size.steps : size.maxSteps;
  if (steps > sizes.maxSteps) return { status: 413, bound: "maxSteps", limit: sizes.maxSteps, asked: steps, field: `${field}.steps` };
  if (size.block > sizes.maxBlock) return { status: 413, bound: "maxBlock", limit: sizes.maxBlock, asked: size.block, field: `${field}.block` };
  const windows = size.states > 0 ? 0 : caWindows(size);
  if (windows > sizes.maxWindows) {
    // Without a block (an iterate, block 1) the windows grow with the steps alone.
    const at = size.block > 1 ? "block" : "steps";
    return { status: 413, bound: "maxWindows", limit: sizes.maxWindows, asked: Math.min(windows, Number.MAX_VALUE), field: `${field}.${at}` };
  }
  const cost = predictedCost(size);
  if (cost > SERVER_BOUNDS.maxCost) return { status: 413, bound: "maxCost", limit: SERVER_BOUNDS.maxCost, asked: Math.round(cost), field };
  return null;
}

/**
 * Windows of the widest CA check the payload could ask for: a block-N supercell of a radius-r CA
 * over T steps reads (2⌈rT/N⌉+1) block symbols of k^N states each (DOMAIN.md §2). An over-estimate
 * when the fields belong to different models, never an under-estimate.
 */
export function caWindows({ k, sourceK, r, block, maxSteps }: Pick<PayloadSize, "k" | "sourceK" | "r" | "block" | "maxSteps">): number {
  const radius = Math.ceil((r * maxSteps) / block);
  // every other model's own table is k^(2r+1) entries, listed in the payload itself; the core bounds each one again
  return Math.max((sourceK ?? k) ** (block * (2 * radius + 1)), k ** (2 * r + 1));
}

/** Small checks may take the fast lane, which large ones never enter. */
export function isSmall(size: PayloadSize): boolean {
  return predictedCost(size) <= SERVER_BOUNDS.smallCost && size.reduceCost <= SERVER_BOUNDS.smallReduceCost && (size.states > 0 || caWindows(size) <= 1 << 16);
}
