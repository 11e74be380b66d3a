import { describe, expect, it } from "vitest";
import { texTokens } from "./texTokens";

describe("texTokens", () => {
  it("reads subscripts and superscripts in order", () => {
    expect(texTokens("f_{146}^{3}")).toEqual([
      { t: "text", text: "f" },
      { t: "sub", children: [{ t: "text", text: "146" }] },
      { t: "sup", children: [{ t: "text", text: "3" }] },
    ]);
  });

  it("turns the configuration space into {0,1} with a blackboard Z exponent", () => {
    expect(texTokens("\\{0,1\\}^{\\mathbb{Z}}")).toEqual([
      { t: "text", text: "{0,1}" },
      { t: "sup", children: [{ t: "text", text: "ℤ" }] },
    ]);
  });

  it("reads symbols, roman text and nested groups", () => {
    expect(texTokens("\\pi \\circ B_{3}")).toEqual([
      { t: "text", text: "π ∘ B" },
      { t: "sub", children: [{ t: "text", text: "3" }] },
    ]);
    expect(texTokens("\\mathrm{id}")).toEqual([{ t: "text", text: "id" }]);
    expect(texTokens("(\\{0,1\\}^{2})^{\\mathbb{Z}}")).toEqual([
      { t: "text", text: "({0,1}" },
      { t: "sup", children: [{ t: "text", text: "2" }] },
      { t: "text", text: ")" },
      { t: "sup", children: [{ t: "text", text: "ℤ" }] },
    ]);
  });

  it("passes unknown commands through as their names instead of failing", () => {
    expect(texTokens("\\alpha x")).toEqual([{ t: "text", text: "alpha x" }]);
  });
});
