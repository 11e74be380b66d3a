import { describe, expect, it } from "vitest";
import { leftOutMaps, mapIdsOf, MAPS_PARAM_LIMIT, type MapLookup } from "./requestedMaps";

const found = (id: string, status: string, retractedReason: string | null = null): MapLookup => ({
  id,
  map: { kind: "projection", block: 2, steps: 2, status, retractedReason, source: { name: "ECA 90" }, target: { name: "ECA 90" } },
});

describe("mapIdsOf", () => {
  it("reads the ids in order, drops blanks and repeats, and keeps those past the limit apart", () => {
    expect(mapIdsOf("a, b,,a,c")).toEqual({ ids: ["a", "b", "c"], extra: [] });
    expect(mapIdsOf(["x,y", "z"])).toEqual({ ids: ["x", "y"], extra: [] });
    expect(mapIdsOf(undefined)).toEqual({ ids: [], extra: [] });
    const many = Array.from({ length: MAPS_PARAM_LIMIT + 2 }, (_, i) => `m${i}`);
    const { ids, extra } = mapIdsOf(many.join(","));
    expect(ids).toHaveLength(32);
    expect(extra).toEqual(["m32", "m33"]);
  });
});

describe("leftOutMaps", () => {
  it("opens certified maps and names each retracted or unknown one with its reason, linking only a map that exists", () => {
    const lookups = [found("ok", "certified"), found("gone", "retracted", "Checked against the wrong convention."), { id: "nope", map: null }];
    expect(leftOutMaps(lookups)).toEqual([
      {
        id: "gone",
        label: "ECA 90 → ECA 90 (projection N=2 T=2)",
        reason: "retracted",
        why: "retracted by a curator: “Checked against the wrong convention.”",
        href: "/atlas/maps/gone",
      },
      { id: "nope", label: "map nope", reason: "not-found", why: "not found: this workspace has no such map, or it is not visible to you", href: null },
    ]);
  });

  it("says retracted without a reason when none was kept, and reports ids past the limit", () => {
    const [retracted, tooMany] = leftOutMaps([found("r", "retracted")], ["m40"]);
    expect(retracted.why).toBe("retracted by a curator");
    expect(tooMany).toEqual({ id: "m40", label: "map m40", reason: "too-many", why: "not opened: an address opens at most 32 maps", href: null });
  });

  it("cuts a very long unknown id so that it cannot widen the notice, and escapes an id in the link", () => {
    const long = "x".repeat(100);
    expect(leftOutMaps([{ id: long, map: null }])[0].label).toBe(`map ${"x".repeat(39)}…`);
    expect(leftOutMaps([found("a/b", "retracted")])[0].href).toBe("/atlas/maps/a%2Fb");
  });

  it("leaves nothing out when every map is certified", () => {
    expect(leftOutMaps([found("a", "certified"), found("b", "certified")])).toEqual([]);
  });
});
