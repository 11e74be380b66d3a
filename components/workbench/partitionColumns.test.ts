import { describe, expect, it } from "vitest";
import { moveState, partitionColumns } from "./partitionColumns";

describe("partitionColumns", () => {
  it("lists each block in use with its states, then one empty column for a new block", () => {
    expect(partitionColumns([0, 1, 1, 2])).toEqual([
      { block: 0, states: [0] },
      { block: 1, states: [1, 2] },
      { block: 2, states: [3] },
      { block: 3, states: [] },
    ]);
  });

  it("offers no new block when every state is alone already", () => {
    expect(partitionColumns([0, 1, 2])).toEqual([
      { block: 0, states: [0] },
      { block: 1, states: [1] },
      { block: 2, states: [2] },
    ]);
  });

  it("skips numbers no state uses and puts the new block after the largest", () => {
    expect(partitionColumns([3, 0, 3, 0, 0])).toEqual([
      { block: 0, states: [1, 3, 4] },
      { block: 3, states: [0, 2] },
      { block: 4, states: [] },
    ]);
  });
});

describe("moveState", () => {
  it("moves one state into the block of the column it was dropped on, leaving the input unchanged", () => {
    const before = [0, 1, 1, 2];
    expect(moveState(before, 3, 0)).toEqual([0, 1, 1, 0]);
    expect(before).toEqual([0, 1, 1, 2]);
  });

  it("ignores a drop of an unknown state or onto a block past the number of states", () => {
    expect(moveState([0, 1], 5, 0)).toEqual([0, 1]);
    expect(moveState([0, 1], 0, 2)).toEqual([0, 1]);
  });
});
