import { describe, expect, it } from "vitest";
import { atlasMapText, mapEndLabels } from "./atlasMaps";

describe("atlasMapText", () => {
  it("names a stored map's kind and main parameter", () => {
    expect(atlasMapText({ kind: "coarse-graining", block: 2, steps: 2 })).toBe("coarse-graining N=2 T=2");
    expect(atlasMapText({ kind: "projection", block: 3, steps: null })).toBe("projection N=3");
    expect(atlasMapText({ kind: "decimation", block: null, steps: 4 })).toBe("decimation k=4");
    expect(atlasMapText({ kind: "iterate", block: null, steps: 2 })).toBe("iterate T=2");
    expect(atlasMapText({ kind: "blocking", block: 5, steps: null })).toBe("blocking N=5");
    expect(atlasMapText({ kind: "lumping", block: null, steps: 1 })).toBe("lumping");
    expect(atlasMapText({ kind: "lumping", block: null, steps: 2 })).toBe("lumping, then k=2");
  });
});

describe("mapEndLabels", () => {
  it("tells apart two models of the same name and leaves a unique name alone", () => {
    const a = { id: "m1", name: "Weather", kind: "markov", address: "sha256:aaaaaaaa11" };
    const b = { id: "m2", name: "weather", kind: "markov", address: "sha256:bbbbbbbb22" };
    const c = { id: "m3", name: "Weather lumped", kind: "markov", address: "sha256:cccccccc33" };
    const labels = mapEndLabels([
      { source: a, target: c },
      { source: b, target: c },
    ]);
    expect(labels).toEqual(
      new Map([
        ["m1", "Weather (markov, aaaaaaaa)"],
        ["m3", "Weather lumped"],
        ["m2", "weather (markov, bbbbbbbb)"],
      ]),
    );
  });

  it("counts a model that ends several maps once", () => {
    const eca = (id: string, rule: number) => ({ id, name: `ECA ${rule}`, kind: "eca", address: `sha256:${id}` });
    expect(mapEndLabels([{ source: eca("x", 105), target: eca("y", 150) }, { source: eca("y", 150), target: eca("y", 150) }])).toEqual(
      new Map([
        ["x", "ECA 105"],
        ["y", "ECA 150"],
      ]),
    );
  });
});
