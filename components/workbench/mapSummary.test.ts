import { describe, expect, it } from "vitest";
import { partitionBlocks, partitionSummary, storedMapSummary } from "./mapSummary";

const lumping = (steps: number | null = 1) => ({ kind: "lumping", block: null, steps });

describe("partitionBlocks", () => {
  it("lists each block's labels in the source's order, blocks by first appearance", () => {
    expect(partitionBlocks(["a", "b", "c", "d", "e"], [1, 0, 1, 2, 0])).toEqual([["a", "c"], ["b", "e"], ["d"]]);
    // A state without a label is named as the models name it by default.
    expect(partitionBlocks([], [0, 0, 1])).toEqual([["s0", "s1"], ["s2"]]);
  });
});

describe("partitionSummary", () => {
  it("writes a small partition in full", () => {
    expect(partitionSummary(["a", "b", "c", "d", "e", "f"], [0, 0, 1, 1, 2, 2])).toBe("{a,b} {c,d} {e,f}");
  });

  it("counts the states of a big block and the blocks past the width, always showing the first block", () => {
    const labels = Array.from({ length: 100 }, (_, i) => `s${i}`);
    // 100 states in 10 blocks of 10 (state i in block i mod 10): written out by hand below.
    const partition = labels.map((_, i) => i % 10);
    expect(partitionSummary(labels, partition)).toBe("{s0,s10,s20,s30,… +6} {s1,s11,s21,s31,… +6} … +8 blocks");
    expect(partitionSummary(labels, partition, { maxChars: 0 })).toBe("{s0,s10,s20,s30,… +6} … +9 blocks");
    expect(partitionSummary(["a", "b"], [0, 1], { maxChars: 0 })).toBe("{a} … +1 block");
  });

  it("cuts a long label", () => {
    expect(partitionSummary(["precipitation", "dry"], [0, 0])).toBe("{precipita…,dry}");
  });
});

describe("storedMapSummary", () => {
  const weather = ["dry", "damp", "wet"];
  it("names a lumping's sizes and blocks with the source chain's labels", () => {
    expect(storedMapSummary(lumping(), { partition: [0, 1, 1], labels: weather })).toBe("lumping 3 → 2: {dry} {damp,wet}");
    expect(storedMapSummary({ kind: "exact-lumping", block: null, steps: 1 }, { partition: [0, 0, 1], labels: weather })).toBe("exact-lumping 3 → 2: {dry,damp} {wet}");
  });

  it("says when a lumping is of the chain's k-step decimation", () => {
    expect(storedMapSummary(lumping(2), { partition: [0, 1, 1], labels: weather })).toBe("lumping k=2, 3 → 2: {dry} {damp,wet}");
  });

  it("gives a decimation its steps and states, and falls back to the kind without the detail", () => {
    expect(storedMapSummary({ kind: "decimation", block: null, steps: 3 }, { states: 4 })).toBe("decimation k=3, 4 states");
    expect(storedMapSummary({ kind: "decimation", block: null, steps: 3 })).toBe("decimation k=3");
    expect(storedMapSummary(lumping(2))).toBe("lumping, then k=2");
    expect(storedMapSummary({ kind: "projection", block: 3, steps: 3 }, { partition: [0, 1] })).toBe("projection N=3 T=3");
  });

  it("stays within a draft's 200 characters for an edge's text even for long labels and many blocks", () => {
    const labels = Array.from({ length: 256 }, (_, i) => `${"long state name ".repeat(12)}${i}`);
    const text = storedMapSummary(lumping(7), { partition: labels.map((_, i) => i % 50), labels });
    expect(text.length).toBeLessThanOrEqual(200);
    expect(text.startsWith("lumping k=7, 256 → 50: {long stat…,long stat…,long stat…,long stat…,… +2}")).toBe(true);
    expect(text.endsWith("… +49 blocks")).toBe(true);
  });
});
