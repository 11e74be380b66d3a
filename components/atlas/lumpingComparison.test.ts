import { describe, expect, it } from "vitest";
import { coarsestLumping } from "@/lib/discovery";
import { formatRational, parseRational } from "@/lib/rational";
import { blocksOf, compareLumpings, comparisonSentence, parseKeepApart, startingLabels } from "./lumpingComparison";

const matrixOf = (rows: string[][]) => rows.map((r) => r.map(parseRational));

/**
 * Worked by hand (definitions in DOMAIN.md §2 and §2b; strong: Kemeny & Snell 1960 §6.3, exact: Buchholz 1994),
 * states a, b, c, starting partition {a | b, c} (state a kept apart):
 *
 *   P =  a: 0    1/2  1/2        strong, block {b, c}: rows of b and c into {a}: 1/3 ≠ 2/3  → split: [0, 1, 2]
 *        b: 1/3  1/3  1/3        exact, from {a}: columns b, c receive 1/2, 1/2                   ✓
 *        c: 2/3  1/6  1/6        exact, from {b, c}: column b 1/3 + 1/6 = 1/2, column c 1/3 + 1/6 = 1/2 ✓ → [0, 1, 1]
 *
 * Exact lumped chain Q[I][J] = |J| · Σ_{i∈I} P[i][j] / |I|: Q[A][A] = 0, Q[A][BC] = 2 · 1/2 / 1 = 1,
 * Q[BC][A] = 1 · (1/3 + 2/3) / 2 = 1/2, Q[BC][BC] = 2 · 1/2 / 2 = 1/2. So the exact lumping is coarser.
 */
const exactCoarser = matrixOf([
  ["0", "1/2", "1/2"],
  ["1/3", "1/3", "1/3"],
  ["2/3", "1/6", "1/6"],
]);

/**
 * Worked by hand, same start {a | b, c}:
 *
 *   P =  a: 0    1/4  3/4        strong: rows of b and c into {a} 1/2, 1/2 and into {b, c} 1/2, 1/2 ✓ → [0, 1, 1]
 *        b: 1/2  1/2  0          exact, from {a}: columns b, c receive 1/4 ≠ 3/4 → split: [0, 1, 2]
 *        c: 1/2  0    1/2
 *
 * Strong lumped chain Q[I][J] = Σ_{j∈J} P[i][j]: Q[A] = (0, 1), Q[BC] = (1/2, 1/2). The strong lumping is coarser.
 */
const strongCoarser = matrixOf([
  ["0", "1/4", "3/4"],
  ["1/2", "1/2", "0"],
  ["1/2", "0", "1/2"],
]);

const lump = (chain: ReturnType<typeof matrixOf>, exact: boolean) => coarsestLumping({ chain, labels: startingLabels(3, [0]), exact });
const shown = (q: ReturnType<typeof lump>["lumped"]) => q?.map((row) => row.map(formatRational));

describe("the coarsest strong and exact lumpings side by side", () => {
  it("finds the exact lumping coarser on a chain whose rows differ but whose columns agree (worked by hand above)", () => {
    const strong = lump(exactCoarser, false);
    const exact = lump(exactCoarser, true);
    expect(strong.partition).toEqual([0, 1, 2]);
    expect(exact.partition).toEqual([0, 1, 1]);
    expect(shown(exact.lumped)).toEqual([
      ["0", "1"],
      ["1/2", "1/2"],
    ]);
    expect(compareLumpings(strong.partition, exact.partition)).toBe("exact-coarser");
  });

  it("finds the strong lumping coarser on a chain whose columns differ but whose rows agree (worked by hand above)", () => {
    const strong = lump(strongCoarser, false);
    const exact = lump(strongCoarser, true);
    expect(strong.partition).toEqual([0, 1, 1]);
    expect(exact.partition).toEqual([0, 1, 2]);
    expect(shown(strong.lumped)).toEqual([
      ["0", "1"],
      ["1/2", "1/2"],
    ]);
    expect(compareLumpings(strong.partition, exact.partition)).toBe("strong-coarser");
  });
});

describe("compareLumpings", () => {
  it("names equal partitions the same whatever their block numbers", () => {
    expect(compareLumpings([0, 1, 1, 0], [1, 0, 0, 1])).toBe("same");
  });

  it("names two partitions neither of which refines the other incomparable", () => {
    expect(compareLumpings([0, 0, 1, 1], [0, 1, 1, 0])).toBe("incomparable");
  });

  it("refuses partitions of different chains", () => {
    expect(() => compareLumpings([0, 0], [0, 0, 1])).toThrow(RangeError);
  });
});

describe("blocksOf and the sentence", () => {
  it("lists each block's state labels in block order", () => {
    expect(blocksOf([0, 1, 1, 0], ["empty", "left busy", "right busy", "both busy"])).toEqual([
      ["empty", "both busy"],
      ["left busy", "right busy"],
    ]);
  });

  it("says which lumping is coarser and how many blocks each has", () => {
    expect(comparisonSentence("exact-coarser", 3, 2)).toBe("They differ: the exact lumping (2 blocks) is coarser, and the strong one (3 blocks) splits some of its blocks.");
    expect(comparisonSentence("same", 1, 1)).toContain("the same 1 block,");
  });
});

describe("parseKeepApart", () => {
  it("reads repeated and comma-separated indices, drops the rest, and sorts", () => {
    expect(parseKeepApart(["3", "1,x", "9", " 1"], 4)).toEqual([1, 3]);
    expect(parseKeepApart(undefined, 4)).toEqual([]);
  });

  it("gives each kept state a starting label of its own", () => {
    expect(startingLabels(4, [1, 3])).toEqual(["rest", "state 1", "rest", "state 3"]);
  });
});
