import { describe, expect, it } from "vitest";
import { decideAsk, type AskRecord } from "./decideAsk";

function record(id: string, maxBlock: number, targets: string[], coverage: object = { kinds: ["projection"] }): AskRecord {
  return {
    id,
    kind: "binary-projections",
    maxBlock,
    algorithm: "exhaustive",
    algorithmVersion: "1",
    coverage: JSON.stringify(coverage),
    outcome: JSON.stringify({ targets }),
    found: targets.length,
    createdAt: new Date(0),
  };
}
const anyScope = () => true;

describe("decideAsk", () => {
  it("answers yes with the shortest chain when a path of certified maps exists, however many searches found nothing", () => {
    const answer = decideAsk({
      sameModel: false,
      paths: [{ mapIds: ["m1"] }, { mapIds: ["m2", "m3"] }],
      records: [record("r", 3, [])],
      targetAddress: "sha256:b",
      targetInScope: anyScope,
    });
    expect(answer).toEqual({ answer: "yes", reason: "chain", mapIds: ["m1"], otherChains: 1 });
  });

  it("answers yes for a model and itself (the identity map)", () => {
    expect(decideAsk({ sameModel: true, paths: [], records: [], targetAddress: "x", targetInScope: anyScope })).toEqual({
      answer: "yes",
      reason: "same-model",
    });
  });

  it("answers no within the widest recorded search whose targets leave out B", () => {
    const answer = decideAsk({
      sameModel: false,
      paths: [],
      records: [record("small", 2, ["sha256:c"]), record("large", 3, ["sha256:c", "sha256:d"])],
      targetAddress: "sha256:b",
      targetInScope: anyScope,
    });
    expect(answer).toMatchObject({ answer: "no", maxBlock: 3, record: { id: "large" } });
  });

  it("does not answer no from a search that found B (the map is merely not stored) or that B lies outside", () => {
    const found = decideAsk({ sameModel: false, paths: [], records: [record("r", 3, ["sha256:b"])], targetAddress: "sha256:b", targetInScope: anyScope });
    expect(found).toEqual({ answer: "unknown", reason: "target-outside-search", searched: 1 });
    const outside = decideAsk({ sameModel: false, paths: [], records: [record("r", 3, [])], targetAddress: "sha256:b", targetInScope: () => false });
    expect(outside.answer).toBe("unknown");
  });

  it("answers unknown when nothing was searched, and ignores records it cannot read", () => {
    expect(decideAsk({ sameModel: false, paths: [], records: [], targetAddress: "b", targetInScope: anyScope })).toEqual({
      answer: "unknown",
      reason: "no-search",
      searched: 0,
    });
    const broken = { ...record("r", 3, []), outcome: "not json" };
    expect(decideAsk({ sameModel: false, paths: [], records: [broken], targetAddress: "b", targetInScope: anyScope }).answer).toBe("unknown");
  });
});
