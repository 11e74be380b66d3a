import { describe, expect, it } from "vitest";
import { issueText, parseMatrixText } from "./matrixText";
import { markovForm, caForm, ecaForm, ecaRuleTable } from "./modelForms";

describe("parseMatrixText", () => {
  it("keeps fractions exact and converts decimals exactly (in floating point 0.1 + 0.2 is not 0.3)", () => {
    expect(0.1 + 0.2 === 0.3).toBe(false); // common practice: binary floating point cannot hold 1/10 exactly
    expect(parseMatrixText("0.1, 0.2, 0.7\n1/3, 1/3, 1/3\n0, 0, 1")).toEqual({
      ok: true,
      matrix: [["1/10", "1/5", "7/10"], ["1/3", "1/3", "1/3"], ["0", "0", "1"]],
    });
  });

  it("reads spaces, tabs and semicolons as separators and skips comments and blank lines", () => {
    expect(parseMatrixText("# two states\n0.25\t0.75\n\n1/2 1/2\n")).toEqual({ ok: true, matrix: [["1/4", "3/4"], ["1/2", "1/2"]] });
    expect(parseMatrixText("1;0\n0;1")).toEqual({ ok: true, matrix: [["1", "0"], ["0", "1"]] });
  });

  it("names the line and column of a bad cell", () => {
    const result = parseMatrixText("# header\n1/2, 1/2\n0.5, abc");
    expect(result).toEqual({ ok: false, issues: [{ line: 3, column: 2, message: '"abc" is not an exact number such as 1/3 or 0.25' }] });
    if (!result.ok) expect(issueText(result.issues[0])).toBe('Line 3, column 2: "abc" is not an exact number such as 1/3 or 0.25');
  });

  it("names each row that does not sum to 1 with its exact sum, and a negative entry", () => {
    const result = parseMatrixText("1/2, 1/3\n3/2, -1/2");
    expect(result.ok).toBe(false);
    if (!result.ok)
      expect(result.issues.map((i) => i.message)).toEqual(["Row 1 sums to 5/6, not 1.", "Entry (2, 2) is negative (-1/2)."]);
  });

  it("refuses a matrix that is not square, naming the row", () => {
    const result = parseMatrixText("1, 0\n1");
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues[0]).toEqual({ line: 2, column: null, message: "Row 2 has 1 entries; a 2-state chain needs 2." });
  });

  it("reads an uploaded Matrix Market coordinate file (NIST exchange format), values exact", () => {
    const file = "%%MatrixMarket matrix coordinate real general\n% a chain\n2 2 3\n1 1 0.5\n1 2 0.5\n2 1 1\n";
    expect(parseMatrixText(file)).toEqual({ ok: true, matrix: [["1/2", "1/2"], ["1", "0"]] });
    const bad = parseMatrixText("%%MatrixMarket matrix coordinate real general\n2 2 1\n1 x 0.5\n");
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.issues[0].line).toBe(3);
  });
});

describe("model forms", () => {
  it("shows an ECA's rule table: rule 110 is 01101110 read from neighbourhood 111 down to 000", () => {
    // Wolfram, Rev. Mod. Phys. 55, 601 (1983): bit 4a+2b+c of the rule number.
    expect(ecaRuleTable(110).map((r) => r.value).join("")).toBe("01101110");
    expect(ecaRuleTable(110)[0]).toEqual({ neighbourhood: "111", value: 0 });
    expect(ecaForm({ rule: "110" })).toEqual({ model: { kind: "eca", rule: 110 }, errors: {} });
    expect(ecaForm({ rule: "256" }).errors.rule).toBe("Rule must be a whole number from 0 to 255.");
    expect(ecaForm({ rule: "1.5" }).errors.rule).toBe("Rule must be a whole number from 0 to 255.");
  });

  it("takes a k-state table as digits, counting k^(2r+1) entries and naming a bad digit", () => {
    expect(caForm({ k: "3", r: "1", digits: "0".repeat(27) }).model).toEqual({ kind: "ca", k: 3, r: 1, table: new Array(27).fill(0) });
    expect(caForm({ k: "3", r: "1", digits: "012" }).errors.table).toBe("The table has 3 of 27 entries (k^(2r+1) = 3^3).");
    expect(caForm({ k: "2", r: "1", digits: "01020000" }).errors.table).toBe('Entry 4 is "2"; each entry is a digit from 0 to 1.');
    expect(caForm({ k: "9", r: "1", digits: "" }).errors.k).toBe("Alphabet size k must be a whole number from 2 to 8.");
  });

  it("builds a chain with labels, or says which label is wrong", () => {
    expect(markovForm({ matrix: "0.5 0.5\n1 0", labels: "up, down" }).model).toEqual({ kind: "markov", labels: ["up", "down"], matrix: [["1/2", "1/2"], ["1", "0"]] });
    expect(markovForm({ matrix: "0.5 0.5\n1 0", labels: "" }).model).toMatchObject({ labels: ["s0", "s1"] });
    expect(markovForm({ matrix: "0.5 0.5\n1 0", labels: "a, a" }).errors.labels).toBe('The label "a" is used twice.');
    expect(markovForm({ matrix: "0.5 0.4\n1 0", labels: "" }).errors.matrix).toBe("Line 1: Row 1 sums to 9/10, not 1.");
  });
});
