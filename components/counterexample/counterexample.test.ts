import { describe, expect, it } from "vitest";
import { ecaTable } from "@/lib/ca";
import { asCounterexample, describeCounterexample, type Witness } from "./describeCounterexample";
import { windowEvolution } from "./spaceTimeRows";

// Rule 110 at block 2 with "all ones": the window 00|00|10 (cells 000010), worked by hand from the
// rule's table (Wolfram code 110 = 01101110 for neighbourhoods 111 … 000): 000010 → 0011 → 11.
const window: Witness = { window: [0, 0, 2], cells: ["00", "00", "10"], image: 3, imageCells: "11", coarseWindow: [0, 0, 0], coarse: 1 };

describe("windowEvolution", () => {
  it("draws the window, each step one cell shorter at either end, and marks the centre block of the last row", () => {
    const { rows, centre } = windowEvolution(window, ecaTable(110), 2);
    expect(rows).toEqual([
      { cells: [0, 0, 0, 0, 1, 0], indent: 0 },
      { cells: [0, 0, 1, 1], indent: 1 },
      { cells: [1, 1], indent: 2 },
    ]);
    expect(centre).toEqual({ from: 0, to: 2 });
  });
});

describe("describeCounterexample", () => {
  it("says a lumping failure with the two states by label, the target block and both exact sums", () => {
    const c = asCounterexample({ kind: "not-lumpable", block: 1, states: [1, 3], targetBlock: 0, sums: ["1/4", "1/3"] });
    expect(c && describeCounterexample(c, { labels: ["A", "B", "C", "D"] })).toBe(
      "“B” and “D” are both in block 2, but they move into block 1 with probability 1/4 and 1/3: the partition is not lumpable.",
    );
  });

  it("says which matrix entry differs, 1-based", () => {
    const c = asCounterexample({ kind: "matrix-entry-mismatch", row: 0, column: 2, claimed: "1/8", actual: "1/4" });
    expect(c && describeCounterexample(c)).toBe("Entry (1, 3) is claimed to be 1/8; computed exactly it is 1/4.");
  });

  it("says an exact-lumping failure with the two states of the target block and both column sums", () => {
    // Hand-built: states 2 and 3 (block 2) receive 1/2 and 1/4 from block 1; DOMAIN.md §2b asks for equal sums.
    const c = asCounterexample({ kind: "not-exactly-lumpable", block: 0, targetBlock: 1, states: [1, 2], sums: ["1/2", "1/4"] });
    expect(c && describeCounterexample(c)).toBe(
      "State 2 and state 3 are both in block 2, but block 1 sends them probability 1/2 and 1/4: the partition is not exactly lumpable.",
    );
  });

  it("says which target state carries the wrong label", () => {
    const c = asCounterexample({ kind: "label-mismatch", state: 0, claimed: "wet", expected: "{N}" });
    expect(c && describeCounterexample(c)).toBe("State 1 of the target chain is labelled “wet”, but the map requires “{N}”.");
  });

  it("ignores what is not a counterexample", () => {
    expect(asCounterexample({ kind: "something-else" })).toBeNull();
    expect(asCounterexample("not-a-function")).toBeNull();
    expect(asCounterexample(null)).toBeNull();
  });
});
