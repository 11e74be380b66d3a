import { describe, expect, it } from "vitest";
import { pictureInputOf, ruleViewOf } from "./ruleViews";

describe("ruleViewOf", () => {
  it("spells ECA 110 as its Wolfram bits, neighbourhood 000 first (110 = 01101110₂)", () => {
    expect(ruleViewOf({ type: "eca", rule: 110 })).toEqual({ k: 2, r: 1, table: [0, 1, 1, 1, 0, 1, 1, 0] });
  });

  it("has no rule table for a chain", () => {
    expect(ruleViewOf({ type: "markov", labels: ["a"], matrix: [["1"]] })).toBeNull();
  });
});

describe("pictureInputOf", () => {
  it("reads a projection certificate, the steps defaulting to the block size", () => {
    const body = JSON.stringify({ map: { kind: "projection", block: 2, projection: [0, 1, 1, 0] }, source: { kind: "eca", rule: 105 }, target: { kind: "eca", rule: 150 } });
    const input = pictureInputOf(body);
    expect(input?.block).toBe(2);
    expect(input?.steps).toBe(2);
    expect(input?.projection).toEqual([0, 1, 1, 0]);
    expect(input?.coarse.table).toEqual([0, 1, 1, 0, 1, 0, 0, 1]);
  });

  it("has no picture for a lumping or a body that is not JSON", () => {
    expect(pictureInputOf(JSON.stringify({ map: { kind: "lumping", partition: [0, 0] } }))).toBeNull();
    expect(pictureInputOf("{")).toBeNull();
  });
});
