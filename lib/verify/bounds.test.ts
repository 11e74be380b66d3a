import { beforeEach, describe, expect, it, vi } from "vitest";
import * as rationalModule from "@/lib/rational";
import * as markovModule from "@/lib/markov";
import { buildRequestRefusal, caCost, chainCost, DEFAULT_LIMITS, readCertificateText, verifyCertificate } from "./index";

// Every path from the checker to arithmetic goes through these two: a bound checked "before any work"
// means neither was called. The spies call the real functions.
vi.mock("@/lib/rational", async (original) => {
  const real = await original<typeof import("@/lib/rational")>();
  return { ...real, parseRational: vi.fn(real.parseRational) };
});
vi.mock("@/lib/markov", async (original) => {
  const real = await original<typeof import("@/lib/markov")>();
  return { ...real, matrixPower: vi.fn(real.matrixPower) };
});
const parseRational = vi.mocked(rationalModule.parseRational);
const matrixPower = vi.mocked(markovModule.matrixPower);
beforeEach(() => {
  parseRational.mockClear();
  matrixPower.mockClear();
});

const base = { format: "squarely-certificate", version: 1 };
const twoState = (a: string, b: string) => ({ kind: "markov", labels: ["a", "b"], matrix: [[a, b], ["1", "0"]] });
/** F(n)/F(n+1) with `digits` digits: consecutive Fibonacci numbers are the worst case of Euclid's algorithm (Lamé, 1844). */
function fibonacciFraction(digits: number): [string, string] {
  let [a, b] = [1n, 1n];
  while (b.toString().length < digits) [a, b] = [b, a + b];
  return [`${a}/${b}`, `${b - a}/${b}`];
}

describe("digits of every rational are bounded on the raw input, before any arithmetic", () => {
  it("refuses a 2-state chain of 20,000-digit fractions as too-large naming maxEntryDigits, without reading one number", () => {
    const chain = twoState(`${"1".repeat(20_000)}/${"3".repeat(20_000)}`, `${"2".repeat(20_000)}/${"3".repeat(20_000)}`);
    const text = JSON.stringify({ ...base, map: { kind: "decimation", steps: 2 }, source: chain, target: chain });
    expect(verifyCertificate(text)).toEqual({ status: "too-large", bound: "maxEntryDigits", limit: 1000, asked: 20_000 });
    expect(verifyCertificate(JSON.parse(text))).toMatchObject({ status: "too-large", bound: "maxEntryDigits" });
    expect(parseRational).not.toHaveBeenCalled();
  });

  it("counts the digits a decimal stands for: 1e5000 has 5001 digits, 0.5e-2000 a 2002-digit denominator", () => {
    for (const [entry, asked] of [
      ["1e5000", 5001],
      ["0.5e-2000", 2002],
    ] as const) {
      const r = verifyCertificate({ ...base, map: { kind: "decimation", steps: 2 }, source: twoState(entry, "0"), target: twoState("1", "0") });
      expect(r).toEqual({ status: "too-large", bound: "maxEntryDigits", limit: 1000, asked });
    }
    expect(parseRational).not.toHaveBeenCalled();
  });

  it("still reads a chain whose entries are within the bound (999-digit Fibonacci fractions hold as a 1-step decimation)", () => {
    const [p, q] = fibonacciFraction(999);
    const chain = twoState(p, q);
    expect(verifyCertificate({ ...base, map: { kind: "decimation", steps: 1 }, source: chain, target: chain }).status).toBe("holds");
  });
});

describe("every bound is checked before any work", () => {
  it("refuses a 2-state chain decimated by 1,000,000 steps at once, naming maxSteps, without computing a power", () => {
    const chain = twoState("1/2", "1/2");
    const r = verifyCertificate({ ...base, map: { kind: "decimation", steps: 1_000_000 }, source: chain, target: chain });
    expect(r).toEqual({ status: "too-large", bound: "maxSteps", limit: 4096, asked: 1_000_000 });
    expect(matrixPower).not.toHaveBeenCalled();
    expect(parseRational).not.toHaveBeenCalled();
  });

  it("refuses 201 states on the raw matrix, before reading its entries", () => {
    const n = 201;
    const chain = { kind: "markov", matrix: Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? "1" : "0"))) };
    expect(verifyCertificate({ ...base, map: { kind: "decimation", steps: 1 }, source: chain, target: chain })).toEqual({ status: "too-large", bound: "maxStates", limit: 200, asked: 201 });
    expect(parseRational).not.toHaveBeenCalled();
  });

  it("refuses a supercell block beyond maxBlock nested inside a model, and a text longer than maxTextLength", () => {
    const deep = { kind: "iterate", base: { kind: "supercell", base: { kind: "eca", rule: 30 }, block: 9 }, steps: 2 };
    expect(verifyCertificate({ ...base, map: { kind: "iterate", steps: 1 }, source: deep, target: deep })).toEqual({ status: "too-large", bound: "maxBlock", limit: 8, asked: 9 });
    expect(readCertificateText(" ".repeat(101), { ...DEFAULT_LIMITS, maxTextLength: 100 })).toEqual({ ok: false, verdict: { status: "too-large", bound: "maxTextLength", limit: 100, asked: 101 } });
  });

  it("refuses a build request beyond the bounds before the builder runs (buildRequestRefusal)", () => {
    const chain = twoState("1/2", "1/2");
    expect(buildRequestRefusal({ kind: "decimation", chain, steps: 1_000_000 }, DEFAULT_LIMITS)).toEqual({ status: "too-large", bound: "maxSteps", limit: 4096, asked: 1_000_000 });
    expect(buildRequestRefusal({ kind: "projection", rule: 105, block: 4, projection: "0110100110010110" }, { ...DEFAULT_LIMITS, maxWindows: 1000 })).toEqual({
      status: "too-large",
      bound: "maxWindows",
      limit: 1000,
      asked: 4096,
    });
    expect(buildRequestRefusal({ kind: "lumping", chain, partition: [0, 1], steps: 3 }, DEFAULT_LIMITS)).toBeNull();
    expect(matrixPower).not.toHaveBeenCalled();
  });
});

describe("the predicted cost of a check is bounded before any work", () => {
  it("computes n³ × D^1.6 × (⌊log2 s⌋ + 1) for chains and windows × steps for CAs (values worked by hand)", () => {
    expect(chainCost(2, 8, 10)).toBeCloseTo(8 * 10 ** 1.6 * 4, 6);
    expect(chainCost(3, 1, 1)).toBe(27);
    expect(caCost(2 ** 24, 8)).toBe(2 ** 27);
  });

  it("refuses a 200-state chain (denominators 2..12) at 2,000 steps as maxChainCost, without computing a power", () => {
    const n = 200;
    // Row i: 1/q on the diagonal and (q-1)/q on the next state, q = 2 + i mod 11; the lcm of 2..12 is 27720 (5 digits).
    const matrix = Array.from({ length: n }, (_, i) => {
      const q = 2 + (i % 11);
      return Array.from({ length: n }, (_, j) => (j === i ? `1/${q}` : j === (i + 1) % n ? `${q - 1}/${q}` : "0"));
    });
    const chain = { kind: "markov", matrix };
    const limits = { ...DEFAULT_LIMITS, maxDigits: 10 ** 6 };
    const r = verifyCertificate({ ...base, map: { kind: "decimation", steps: 2000 }, source: chain, target: chain }, limits);
    expect(r).toEqual({ status: "too-large", bound: "maxChainCost", limit: 1e12, asked: chainCost(200, 2000, 2000 * 5) });
    expect(matrixPower).not.toHaveBeenCalled();
  });

  it("refuses the audit's case at once: a 200-state chain with denominators near 10^4 lumped at 2,000 steps (P^2000 would have about a million digits)", () => {
    const n = 200;
    const matrix = Array.from({ length: n }, (_, i) => {
      const q = 9_973 + i;
      return Array.from({ length: n }, (_, j) => (j === i ? `1/${q}` : j === (i + 1) % n ? `${q - 1}/${q}` : "0"));
    });
    const labels = Array.from({ length: n }, (_, i) => `s${i}`);
    const partition = Array.from({ length: n }, (_, i) => i % 2);
    const target = { kind: "markov", labels: ["{x}", "{y}"], matrix: [["1/2", "1/2"], ["1/2", "1/2"]] };
    const r = verifyCertificate({ ...base, map: { kind: "lumping", partition, steps: 2000 }, source: { kind: "markov", labels, matrix }, target });
    expect(r).toMatchObject({ status: "too-large", bound: "maxDigits", limit: 20_000 });
    // Predicted digits: 2000 × the digits of lcm(9973, …, 10172), computed here with Euclid's algorithm.
    let lcm = 1n;
    const gcd = (a: bigint, b: bigint): bigint => (b === 0n ? a : gcd(b, a % b));
    for (let i = 0; i < n; i++) lcm = (lcm / gcd(lcm, BigInt(9_973 + i))) * BigInt(9_973 + i);
    expect(r.status === "too-large" && r.asked).toBe(2000 * lcm.toString().length);
    expect(matrixPower).not.toHaveBeenCalled();
  });

  it("refuses an iterate whose windows × steps exceed maxCaCost when the window bound is raised (ECA 30, 13 steps: 2^27 × 13)", () => {
    const r = verifyCertificate({ ...base, map: { kind: "iterate", steps: 13 }, source: { kind: "eca", rule: 30 }, target: { kind: "eca", rule: 30 } }, { ...DEFAULT_LIMITS, maxWindows: 2 ** 30 });
    expect(r).toEqual({ status: "too-large", bound: "maxCaCost", limit: 2 ** 30, asked: 2 ** 27 * 13 });
  });
});

describe("duplicate member names and deep nesting are refused before parsing (I-JSON, RFC 7493 §2.3)", () => {
  const text = (source: string) => `{"format":"squarely-certificate","version":1,"map":{"kind":"projection","block":2,"projection":[0,1,1,0]},"source":${source},"target":{"kind":"eca","rule":150}}`;

  it("refuses \"rule\":150,\"rule\":105 as malformed, naming the object and the name, where JSON.parse would keep 105", () => {
    const dup = text('{"kind":"eca","rule":150,"rule":105}');
    expect(JSON.parse(dup).source.rule).toBe(105);
    const r = verifyCertificate(dup);
    expect(r.status).toBe("malformed");
    if (r.status === "malformed") {
      expect(r.issues[0].path).toBe("source");
      expect(r.issues[0].message).toMatch(/"rule" appears twice.*RFC 7493/);
    }
    expect(verifyCertificate(text('{"kind":"eca","rule":105}')).status).toBe("holds");
  });

  it("sees a name spelled with an escape as the same name (\\u0072ule is rule), and names inside arrays by index", () => {
    expect(verifyCertificate(text('{"kind":"eca","rule":105,"\\u0072ule":105}')).status).toBe("malformed");
    const r = readCertificateText('{"a":[{"x":1},{"x":1,"x":2}]}');
    expect(r).toMatchObject({ ok: false, verdict: { status: "malformed", issues: [{ path: "a.1" }] } });
    expect(readCertificateText('{"a":{"x":1},"b":{"x":1},"s":"\\"x\\":"}')).toEqual({ ok: true, value: { a: { x: 1 }, b: { x: 1 }, s: '"x":' } });
  });

  it("refuses nesting deeper than maxNesting (64) before parsing, even 100,000 levels that would overflow a recursive reader", () => {
    for (const depth of [65, 100_000]) {
      const r = readCertificateText("[".repeat(depth) + "]".repeat(depth));
      expect(r).toMatchObject({ ok: false, verdict: { status: "malformed", issues: [{ message: expect.stringMatching(/deeper than 64 levels.*maxNesting/) }] } });
    }
    expect(readCertificateText("[".repeat(64) + "]".repeat(64)).ok).toBe(true);
    expect(readCertificateText("null")).toEqual({ ok: true, value: null });
    expect(verifyCertificate("null").status).toBe("malformed");
    let deep: unknown = 1;
    for (let i = 0; i < 100; i++) deep = { kind: "iterate", base: deep, steps: 2 };
    expect(verifyCertificate({ ...base, map: { kind: "iterate", steps: 1 }, source: deep, target: deep })).toMatchObject({ status: "malformed", issues: [{ message: expect.stringMatching(/maxNesting/) }] });
  });
});
