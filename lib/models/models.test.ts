import { describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import fc from "fast-check";
import { z } from "zod";
import { ecaTable, supercellTable } from "@/lib/ca";
import {
  ModelInputError,
  ModelSchema,
  canonicalModel,
  caShape,
  describeModel,
  modelAddress,
  modelRuleTable,
  modelsEqual,
  sha256Hex,
  type Model,
} from "./index";

describe("sha256Hex", () => {
  it("gives the FIPS 180-2 test vector for 'abc' (ba7816bf…)", () => {
    expect(sha256Hex("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });

  it("agrees with node:crypto on random strings, including multi-byte UTF-8 and block boundaries", () => {
    fc.assert(fc.property(fc.string({ unit: "grapheme", maxLength: 200 }), (s) => sha256Hex(s) === createHash("sha256").update(s, "utf8").digest("hex")));
    for (const n of [55, 56, 63, 64, 65, 119, 120]) expect(sha256Hex("x".repeat(n))).toBe(createHash("sha256").update("x".repeat(n)).digest("hex"));
  });
});

const oz = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };

describe("canonicalModel", () => {
  it("makes equal models equal whatever their spelling: decimals, unreduced fractions", () => {
    const spelled = { kind: "markov", labels: ["R", "N", "S"], matrix: [["0.5", "2/8", "0.25"], ["1/2", "0/3", "0.50"], ["1/4", "0.25", "2/4"]] };
    expect(modelAddress(canonicalModel(spelled))).toBe(modelAddress(canonicalModel(oz)));
    expect(canonicalModel(spelled)).toEqual(oz);
  });

  it("turns a k = 2, r = 1 CA into its ECA (the table read as bits is the rule number, DOMAIN.md §1)", () => {
    const table = Array.from(ecaTable(110).table);
    expect(canonicalModel({ kind: "ca", k: 2, r: 1, table })).toEqual({ kind: "eca", rule: 110 });
  });

  it("fills in default labels and the default supercell steps T = N", () => {
    expect(canonicalModel({ kind: "markov", matrix: [["1"]] })).toEqual({ kind: "markov", labels: ["0"], matrix: [["1"]] });
    expect(canonicalModel({ kind: "supercell", base: { kind: "eca", rule: 105 }, block: 2 })).toEqual({
      kind: "supercell",
      base: { kind: "eca", rule: 105 },
      block: 2,
      steps: 2,
    });
  });

  it("multiplies nested iterates and decimations out and drops 1-step ones", () => {
    const eca = { kind: "eca", rule: 30 };
    expect(canonicalModel({ kind: "iterate", base: { kind: "iterate", base: eca, steps: 2 }, steps: 3 })).toEqual({ kind: "iterate", base: eca, steps: 6 });
    expect(canonicalModel({ kind: "iterate", base: eca, steps: 1 })).toEqual(eca);
    expect(canonicalModel({ kind: "decimated", base: { kind: "decimated", base: oz, steps: 2 }, steps: 5 })).toEqual({ kind: "decimated", base: oz, steps: 10 });
    expect(canonicalModel({ kind: "supercell", base: eca, block: 1, steps: 3 })).toEqual({ kind: "iterate", base: eca, steps: 3 });
  });

  it("keeps the dynamics: a block-1 supercell and the supercell of an iterate have the tables of what they canonicalise to", () => {
    const f = { kind: "eca", rule: 54 } as const;
    const viaIterate = canonicalModel({ kind: "supercell", base: { kind: "iterate", base: f, steps: 2 }, block: 3, steps: 2 });
    expect(viaIterate).toEqual({ kind: "supercell", base: f, block: 3, steps: 4 });
    expect(Array.from(modelRuleTable(viaIterate).table)).toEqual(Array.from(supercellTable(supercellTable(ecaTable(54), 1, 2), 3, 2).table));
  });

  it("lists every problem with its path", () => {
    const bad = (input: unknown) => {
      try {
        canonicalModel(input);
      } catch (e) {
        return e instanceof ModelInputError ? e.issues : [];
      }
      return [];
    };
    expect(bad({ kind: "markov", matrix: [["1/2", "1/3"], ["0", "1"]] })[0]).toMatchObject({ path: "matrix", message: expect.stringMatching(/row 1 sums to 5\/6/) });
    expect(bad({ kind: "markov", matrix: [["x"]] })[0]).toMatchObject({ path: "matrix.0.0" });
    expect(bad({ kind: "eca", rule: 300 })[0].path).toBe("rule");
    expect(bad({ kind: "ca", k: 3, r: 1, table: [0, 1] })[0]).toMatchObject({ path: "table", message: expect.stringMatching(/27 entries/) });
    expect(bad({ kind: "supercell", base: oz, block: 2 })[0]).toMatchObject({ path: "base" });
    expect(bad({ kind: "markov", labels: ["a", "a"], matrix: [["1", "0"], ["0", "1"]] })[0].message).toMatch(/distinct/);
    expect(bad({ kind: "eca", rule: 1, extra: true }).length).toBe(1);
  });

  it("does not mutate its input", () => {
    const input = structuredClone(oz);
    canonicalModel(input);
    expect(input).toEqual(oz);
  });
});

describe("model addresses and names", () => {
  it("addresses a model by sha256 of its RFC 8785 form, independent of key order", () => {
    const a = modelAddress({ kind: "eca", rule: 146 });
    expect(a).toMatch(/^sha256:[0-9a-f]{64}$/);
    expect(a).toBe(`sha256:${createHash("sha256").update('{"kind":"eca","rule":146}').digest("hex")}`);
    expect(modelsEqual(canonicalModel({ rule: 146, kind: "eca" }), { kind: "eca", rule: 146 })).toBe(true);
  });

  it("describes models briefly", () => {
    const cases: [Model, string][] = [
      [{ kind: "eca", rule: 146 }, "ECA 146"],
      [canonicalModel(oz), "Markov chain (3 states)"],
      [{ kind: "supercell", base: { kind: "eca", rule: 105 }, block: 2, steps: 2 }, "rule 105, block 2 supercell"],
      [{ kind: "iterate", base: { kind: "eca", rule: 110 }, steps: 3 }, "rule 110, 3-step iterate"],
      [{ kind: "decimated", base: canonicalModel(oz), steps: 4 }, "Markov chain (3 states), 4-step decimation"],
    ];
    for (const [model, text] of cases) expect(describeModel(model)).toBe(text);
  });

  it("knows the alphabet and radius of derived CAs without building them", () => {
    expect(caShape({ kind: "supercell", base: { kind: "eca", rule: 1 }, block: 3, steps: 5 })).toEqual({ k: 8, r: 2 });
    expect(caShape({ kind: "iterate", base: { kind: "eca", rule: 1 }, steps: 4 })).toEqual({ k: 2, r: 4 });
  });

  it("exports the model schema as JSON Schema", () => {
    const schema = z.toJSONSchema(ModelSchema) as { oneOf?: unknown[] };
    expect(schema.oneOf).toHaveLength(6);
  });
});
