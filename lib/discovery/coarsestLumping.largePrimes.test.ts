import fc from "fast-check";
import Fraction from "fraction.js";
import { describe, expect, it } from "vitest";
import { parseRational, type Rational } from "@/lib/rational";
import { largePrimeMatrix } from "@/lib/markov/testSupport";
import { coarsestLumping } from "./coarsestLumping";

/** All set partitions of n states in canonical form (restricted growth strings), written here. */
function setPartitions(n: number): number[][] {
  const out: number[][] = [];
  const grow = (prefix: number[], blocks: number) => {
    if (prefix.length === n) return void out.push(prefix);
    for (let b = 0; b <= blocks; b++) grow([...prefix, b], Math.max(blocks, b + 1));
  };
  grow([], 0);
  return out;
}

/** Strong lumpability with fraction.js alone (Kemeny & Snell 1960, §6.3): equal row sums into every block within each block. */
function lumpable(p: string[][], partition: number[]): boolean {
  const blocks = Math.max(...partition) + 1;
  const into = (i: number, J: number) => p[i].reduce((s, x, j) => (partition[j] === J ? s.add(new Fraction(x)) : s), new Fraction(0));
  return partition.every((I, i) => {
    const first = partition.indexOf(I);
    return Array.from({ length: blocks }, (_, J) => J).every((J) => into(i, J).equals(into(first, J)));
  });
}

/** The coarsest lumpable partition refining the labels, by brute force: the lumpable refinement with the fewest blocks (it is unique). */
function coarsestByBruteForce(p: string[][], labels: string[]): number[] {
  const refinesLabels = (partition: number[]) => partition.every((b, i) => partition.every((c, j) => b !== c || labels[i] === labels[j]));
  const candidates = setPartitions(p.length).filter((x) => refinesLabels(x) && lumpable(p, x));
  return candidates.reduce((best, x) => (Math.max(...x) < Math.max(...best) ? x : best));
}

const text = (m: Rational[][]) => m.map((row) => row.map((x) => (x.den === 1n ? `${x.num}` : `${x.num}/${x.den}`)));

describe("coarsestLumping with denominators beyond 2^53 when multiplied (its BigInt path)", () => {
  it("finds {0,1}|{2,3} for a 4-state chain over 10^9+7 and 998244353, where each block sum adds two different entries", () => {
    const [p, q] = ["1000000007", "998244353"];
    // Rows 0 and 1 send 1/p + 1/q into {0,1} and the rest into {2,3}, split differently; rows 2 and 3 send 1/2 into each.
    const matrix = [
      [`1/${p}`, `1/${q}`, `${BigInt(p) - 2n}/${2n * BigInt(p)}`, `${BigInt(q) - 2n}/${2n * BigInt(q)}`],
      [`1/${q}`, `1/${p}`, `${BigInt(q) - 2n}/${2n * BigInt(q)}`, `${BigInt(p) - 2n}/${2n * BigInt(p)}`],
      ["1/4", "1/4", "1/4", "1/4"],
      ["1/2", "0", "0", "1/2"],
    ];
    const labels = ["a", "a", "b", "b"];
    expect(coarsestByBruteForce(matrix, labels)).toEqual([0, 0, 1, 1]);
    const found = coarsestLumping({ chain: matrix.map((row) => row.map(parseRational)), labels });
    expect(found.partition).toEqual([0, 0, 1, 1]);
  });

  it("property: agrees with the brute-force fraction.js reference on random 4-state chains over large primes", () => {
    fc.assert(
      fc.property(largePrimeMatrix(4), fc.array(fc.constantFrom("a", "b"), { minLength: 4, maxLength: 4 }), (m, labels) => {
        const found = coarsestLumping({ chain: m, labels });
        expect(found.partition).toEqual(coarsestByBruteForce(text(m), labels));
      }),
      { numRuns: 40 },
    );
  });
});
