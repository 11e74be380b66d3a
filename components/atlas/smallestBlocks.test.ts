import { describe, expect, it } from "vitest";
import { smallestBlockTable, type CongruenceRecordRow } from "./smallestBlocks";

// Rows shaped as server/jobs/kinds/ca-findings.compute.ts partitionFindings writes them (written out by hand).
const found = (rule: number, blocks: number[], classes: number): CongruenceRecordRow => ({
  rule,
  modelId: `m${rule}`,
  coverage: JSON.stringify({ rule, blocks, steps: "T = N", exhaustive: false }),
  outcome: JSON.stringify({ targets: ["sha256:x"], properCongruence: true, smallestBlock: blocks[blocks.length - 1], classes }),
});
const none = (rule: number, blocks: number[]): CongruenceRecordRow => ({
  rule,
  modelId: `m${rule}`,
  coverage: JSON.stringify({ rule, blocks, steps: "T = N", exhaustive: true }),
  outcome: JSON.stringify({ targets: [], properCongruence: false }),
});

describe("smallestBlockTable", () => {
  it("groups rules by the smallest block with a proper partition, and lists 'none up to N' widest first", () => {
    const table = smallestBlockTable([found(0, [2], 2), found(1, [2, 3], 2), found(2, [2], 3), none(30, [2, 3, 4, 5, 6, 7, 8, 9]), none(45, [2, 3, 4, 5])]);
    expect(table.byBlock).toEqual([
      { block: 2, rules: [{ rule: 0, modelId: "m0", classes: 2 }, { rule: 2, modelId: "m2", classes: 3 }] },
      { block: 3, rules: [{ rule: 1, modelId: "m1", classes: 2 }] },
    ]);
    expect(table.none).toEqual([
      { upTo: 9, rules: [{ rule: 30, modelId: "m30" }] },
      { upTo: 5, rules: [{ rule: 45, modelId: "m45" }] },
    ]);
    expect(table.unsearched).toHaveLength(256 - 5);
    expect(table.unsearched).not.toContain(30);
  });

  it("keeps the widest negative search and lets a found partition win over any 'none'", () => {
    const table = smallestBlockTable([none(30, [2, 3]), none(30, [2, 3, 4, 5, 6, 7, 8, 9]), none(30, [2, 3, 4]), none(9, [2]), found(9, [2, 3], 4)]);
    expect(table.none).toEqual([{ upTo: 9, rules: [{ rule: 30, modelId: "m30" }] }]);
    expect(table.byBlock).toEqual([{ block: 3, rules: [{ rule: 9, modelId: "m9", classes: 4 }] }]);
  });

  it("ignores a search that did not start at block 2 (it cannot say which block is smallest), one at T ≠ N, and unreadable rows", () => {
    const atFourSteps = { ...none(9, [2, 3]), coverage: JSON.stringify({ rule: 9, blocks: [2, 3], steps: 4, exhaustive: true }) };
    const table = smallestBlockTable([found(7, [4, 5], 2), none(8, [3, 4]), { rule: 11, modelId: "m11", coverage: "{", outcome: "{}" }, atFourSteps]);
    expect(table).toEqual({ byBlock: [], none: [], unsearched: Array.from({ length: 256 }, (_, i) => i) });
  });
});
