import { describe, expect, it } from "vitest";
import type { AskRecord } from "./decideAsk";
import { targetInScope } from "./searchScope";

const record = (kind: string): AskRecord => ({
  id: "r",
  kind,
  maxBlock: 3,
  algorithm: "exhaustive",
  algorithmVersion: "1",
  coverage: "{}",
  outcome: "{}",
  found: 0,
  createdAt: new Date(0),
});

describe("targetInScope", () => {
  it("lets a binary projection search speak only about ECA targets (binary, radius 1 when T = N)", () => {
    expect(targetInScope(record("binary-projections"), {}, "eca")).toBe(true);
    expect(targetInScope(record("binary-projections"), {}, "markov")).toBe(false);
    expect(targetInScope(record("binary-projections"), {}, "ca")).toBe(false);
  });

  it("lets a lumping search speak only about Markov chains", () => {
    expect(targetInScope(record("lumpings"), {}, "markov")).toBe(true);
    expect(targetInScope(record("lumpings"), {}, "eca")).toBe(false);
  });

  it("follows the record's own list of target kinds when it gives one", () => {
    expect(targetInScope(record("binary-projections"), { targetKinds: ["ca"] }, "ca")).toBe(true);
    expect(targetInScope(record("binary-projections"), { targetKinds: ["ca"] }, "eca")).toBe(false);
  });

  it("proves nothing from a search that says it was not exhaustive", () => {
    expect(targetInScope(record("binary-projections"), { targetKinds: ["eca"], exhaustive: false }, "eca")).toBe(false);
    expect(targetInScope(record("binary-projections"), { targetKinds: ["eca"], exhaustive: true }, "eca")).toBe(true);
  });

  it("claims nothing for a search kind it does not know", () => {
    expect(targetInScope(record("something-new"), {}, "eca")).toBe(false);
  });
});
