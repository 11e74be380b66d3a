import { describe, expect, it } from "vitest";
import { tikzSquare } from "./tikzSquare";

function balanced(text: string): boolean {
  let depth = 0;
  for (let i = 0; i < text.length; i++) {
    if (text[i] === "\\" && (text[i + 1] === "{" || text[i + 1] === "}")) {
      i++;
      continue;
    }
    if (text[i] === "{") depth++;
    if (text[i] === "}") depth--;
    if (depth < 0) return false;
  }
  return depth === 0;
}

describe("tikzSquare", () => {
  it("draws a block-3 coarse-graining of ECA 146 onto ECA 128 as f^3 on top, g below, pi∘B_3 down the sides", () => {
    const tex = tikzSquare({
      kind: "coarse-graining",
      block: 3,
      source: { kind: "eca", rule: 146 },
      target: { kind: "eca", rule: 128 },
      certificateAddress: "sha256:abc",
    });
    expect(tex).toContain('\\arrow[r, "f_{146}^{3}"]');
    expect(tex).toContain('\\arrow[r, "g_{128}"\']');
    expect(tex).toContain('\\arrow[d, "\\pi \\circ B_{3}"\']');
    expect(tex).toContain("% certificate sha256:abc");
    expect(tex.split("\n").filter((l) => l.includes("\\{0,1\\}^{\\mathbb{Z}}"))).toHaveLength(2);
  });

  it("reads a projection certificate from the base CA as blocking then projection, and from a supercell as π alone", () => {
    const fromBase = tikzSquare({ kind: "projection", block: 3, steps: 3, source: { kind: "eca", rule: 146 }, target: { kind: "eca", rule: 128 } });
    expect(fromBase).toContain('"f_{146}^{3}"');
    expect(fromBase).toContain('"\\pi \\circ B_{3}"');
    const fromSupercell = tikzSquare({ kind: "projection", block: 3, source: { kind: "supercell", alphabet: 8 }, target: { kind: "eca", rule: 128 } });
    expect(fromSupercell).toContain('\\arrow[r, "F"]');
    expect(fromSupercell).toContain('"\\pi"\'');
    expect(fromSupercell).toContain("\\{0,\\dots,7\\}^{\\mathbb{Z}}");
  });

  it("uses the steps when they differ from the block size (T ≠ N)", () => {
    const tex = tikzSquare({ kind: "coarse-graining", block: 2, steps: 4, source: { kind: "eca", rule: 90 }, target: { kind: "eca", rule: 90 } });
    expect(tex).toContain('"f_{90}^{4}"');
  });

  it("draws a strong lumping as P V = V Q on row vectors (Kemeny & Snell 1960, §6.3)", () => {
    const tex = tikzSquare({ kind: "lumping", source: { kind: "markov", states: 3 }, target: { kind: "markov", states: 2 } });
    expect(tex).toContain('\\mathbb{R}^{3} \\arrow[r, "P"] \\arrow[d, "V_{\\pi}"\'] & \\mathbb{R}^{3} \\arrow[d, "V_{\\pi}"]');
    expect(tex).toContain('\\mathbb{R}^{2} \\arrow[r, "Q"\'] & \\mathbb{R}^{2}');
  });

  it("names a general CA's alphabet and a decimation's power", () => {
    const ca = tikzSquare({ kind: "iterate", steps: 2, source: { kind: "ca", alphabet: 3 }, target: { kind: "ca", alphabet: 3 } });
    expect(ca).toContain("\\{0,\\dots,2\\}^{\\mathbb{Z}}");
    expect(ca).toContain('"f^{2}"');
    const chain = tikzSquare({ kind: "decimation", steps: 5, source: { kind: "markov", states: 4 }, target: { kind: "markov", states: 4 } });
    expect(chain).toContain('"P^{5}"');
    expect(chain).toContain('"\\mathrm{id}"');
  });

  it("writes the blocked space of a supercell target as (A^N)^Z", () => {
    const tex = tikzSquare({ kind: "blocking", block: 2, source: { kind: "eca", rule: 30 }, target: { kind: "supercell" } });
    expect(tex).toContain("(\\{0,1\\}^{2})^{\\mathbb{Z}}");
    expect(tex).toContain('"B_{2}"');
  });

  it("produces a complete tikzcd environment with balanced braces for every map kind", () => {
    for (const kind of ["decimation", "lumping", "iterate", "blocking", "projection", "coarse-graining"]) {
      const tex = tikzSquare({ kind, block: 2, source: { kind: "eca", rule: 1 }, target: { kind: "eca", rule: 2 } });
      expect(tex).toMatch(/\\begin\{tikzcd\}[\s\S]*\\end\{tikzcd\}$/);
      expect(tex.match(/\\arrow/g)).toHaveLength(4);
      expect(balanced(tex)).toBe(true);
    }
  });
});
