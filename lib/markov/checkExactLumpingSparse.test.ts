import { describe, expect, it } from "vitest";
import { parseRational, rational, type Rational } from "@/lib/rational";
import { checkExactLumping } from "./checkExactLumping";
import { checkExactLumpingSparse, type SparseRows } from "./checkExactLumpingSparse";
import { formatMatrix, MatrixInputError, type Matrix } from "./matrix";
import { seededRandom } from "@/lib/random";

const q = (rows: string[][]): Matrix => rows.map((r) => r.map(parseRational));

/** Dense → sparse rows with the zero entries left out (written here, apart from the search's own converter). */
function rows(p: Matrix): SparseRows {
  const rowStart = new Int32Array(p.length + 1);
  const col: number[] = [];
  const value: Rational[] = [];
  p.forEach((row, i) => {
    row.forEach((v, j) => {
      if (v.num !== 0n) {
        col.push(j);
        value.push(v);
      }
    });
    rowStart[i + 1] = col.length;
  });
  return { size: p.length, rowStart, col: Int32Array.from(col), value };
}

/** The same hand-worked chain as checkExactLumping.test.ts (Buchholz 1994 condition worked by hand there). */
const HAND = q([
  ["1/2", "1/4", "1/4"],
  ["1/3", "1/3", "1/3"],
  ["1/6", "5/12", "5/12"],
]);

/** A random chain built exactly lumpable on `blocks` (block sums into each column of a block equal), zeros included. */
function randomChain(random: () => number, blocks: number[], lumpable: boolean): Matrix {
  const n = blocks.length;
  const weights = Array.from({ length: n }, () => Array.from({ length: n }, () => (random() < 0.3 ? 0 : 1 + Math.floor(random() * 4))));
  if (lumpable)
    // a doubly-structured choice: P[i][j] depends only on (i, block of j), so every column of a block gets the same sum
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) weights[i][j] = weights[i][blocks.indexOf(blocks[j])];
  return weights.map((w) => {
    const total = w.reduce((a, b) => a + b, 0);
    return total === 0 ? w.map((_, j) => rational(j === 0 ? 1 : 0)) : w.map((x) => rational(x, total));
  });
}

describe("checkExactLumpingSparse", () => {
  it("holds on the hand-worked chain with the same lumped chain as the dense checker", () => {
    const check = checkExactLumpingSparse(rows(HAND), [0, 1, 1]);
    expect(check.ok && check.lumped.map((e) => [e.from, e.to, `${e.value.num}/${e.value.den}`])).toEqual([
      [0, 0, "1/2"],
      [0, 1, "1/2"],
      [1, 0, "1/4"],
      [1, 1, "3/4"],
    ]);
  });

  it("fails with the dense checker's counterexample on the hand-worked chain", () => {
    expect(checkExactLumpingSparse(rows(HAND), [0, 0, 1])).toEqual(checkExactLumping(HAND, [0, 0, 1]));
  });

  it("names a state of the target block that the source block does not reach (its column sum is 0)", () => {
    const p = q([
      ["0", "1", "0"],
      ["1", "0", "0"],
      ["0", "0", "1"],
    ]);
    // from {0}: column 1 gets 1, column 2 (same block {1, 2}) gets 0
    expect(checkExactLumpingSparse(rows(p), [0, 1, 1])).toEqual({ ok: false, counterexample: { kind: "not-exactly-lumpable", block: 0, targetBlock: 1, states: [1, 2], sums: ["1", "0"] } });
  });

  it("agrees with the dense checker on random chains and partitions, lumped chain included", () => {
    const random = seededRandom(31);
    let holds = 0;
    for (let trial = 0; trial < 60; trial++) {
      const n = 2 + Math.floor(random() * 7);
      const blocks = Array.from({ length: n }, () => Math.floor(random() * 3));
      const p = randomChain(random, blocks, trial % 2 === 0);
      const dense = checkExactLumping(p, blocks);
      const sparse = checkExactLumpingSparse(rows(p), blocks);
      expect(sparse.ok).toBe(dense.ok);
      if (dense.ok && sparse.ok) {
        holds++;
        const Q = formatMatrix(dense.lumped);
        for (const e of sparse.lumped) expect(`${e.value.num}/${e.value.den}`.replace(/\/1$/, "")).toBe(Q[e.from][e.to]);
        expect(sparse.lumped.length).toBe(Q.flat().filter((x) => x !== "0").length);
      } else if (!sparse.ok) {
        // a genuine violation: both states in the target block, and the written sums are the true column sums
        const { block, targetBlock, states, sums } = sparse.counterexample;
        const canonical = blocks.map((b) => [...new Set(blocks)].indexOf(b));
        expect(states.map((j) => canonical[j])).toEqual([targetBlock, targetBlock]);
        const columnSum = (j: number) => p.reduce((acc, row, i) => (canonical[i] === block ? acc + Number(row[j].num) / Number(row[j].den) : acc), 0);
        expect(sums.map((x) => Number(parseRational(x).num) / Number(parseRational(x).den))).toEqual(states.map((j) => expect.closeTo(columnSum(j), 12)));
        expect(sums[0]).not.toBe(sums[1]);
      }
    }
    expect(holds).toBeGreaterThan(20);
  });

  it("refuses a row that does not sum to 1 and a partition of the wrong length", () => {
    const bad = q([
      ["1/2", "1/4"],
      ["1/2", "1/2"],
    ]);
    expect(() => checkExactLumpingSparse(rows(bad), [0, 1])).toThrow(MatrixInputError);
    expect(() => checkExactLumpingSparse(rows(HAND), [0, 1])).toThrow(/partition/);
  });
});
