import { describe, expect, it } from "vitest";
import { atlasHref, parseAtlasFilters } from "./atlasFilters";

const allowed = { mapKinds: ["lumping", "coarse-graining"], modelKinds: ["markov", "eca"] };

describe("parseAtlasFilters", () => {
  it("reads every filter from the URL and trims text", () => {
    const { filters, problems } = parseAtlasFilters(
      { q: " traffic ", rule: "184", class: "184", tag: "demo", block: "2", mapKind: "coarse-graining", kind: "eca", cursor: "abc" },
      allowed,
    );
    expect(problems).toEqual([]);
    expect(filters).toEqual({ q: "traffic", rule: 184, class: 184, tag: "demo", block: 2, mapKind: "coarse-graining", kind: "eca", cursor: "abc" });
  });

  it("drops bad values and names their fields", () => {
    const { filters, problems } = parseAtlasFilters({ rule: "256", block: "two", mapKind: "teleport", kind: "quantum" }, allowed);
    expect(filters).toEqual({});
    expect(problems.map((p) => p.field)).toEqual(["rule", "block", "mapKind", "kind"]);
    expect(problems[0].message).toBe("must be a whole number from 0 to 255");
  });

  it("reads whether the maps list includes the maps onto the constant rules, and names a bad value", () => {
    expect(parseAtlasFilters({ view: "maps", constant: "include" }, allowed).filters).toEqual({ view: "maps", constant: "include" });
    expect(parseAtlasFilters({ constant: "only" }, allowed).filters).toEqual({ constant: "only" });
    const bad = parseAtlasFilters({ constant: "all" }, allowed);
    expect(bad.filters).toEqual({});
    expect(bad.problems).toEqual([{ field: "constant", message: "must be include or only" }]);
  });

  it("takes the first of repeated parameters and ignores empty ones", () => {
    expect(parseAtlasFilters({ rule: ["30", "90"], q: "", tag: "  " }, allowed).filters).toEqual({ rule: 30 });
  });
});

describe("atlasHref", () => {
  it("round-trips filters through the URL", () => {
    const filters = { q: "a b&c", rule: 90, block: 3, mapKind: "lumping" };
    const href = atlasHref(filters);
    const params = Object.fromEntries(new URL(href, "http://x").searchParams);
    expect(parseAtlasFilters(params, allowed).filters).toEqual(filters);
  });

  it("gives the bare page without filters", () => {
    expect(atlasHref({})).toBe("/atlas");
  });
});
