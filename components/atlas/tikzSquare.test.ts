import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { checkProjection, supercellTable, ecaTable } from "@/lib/ca";
import { certifyBlocking, certifyDecimation, certifyIterate, certifyLumping, certifyProjection, type Certificate } from "@/lib/certificate";
import { formatMatrix } from "@/lib/markov";
import { liftedChain } from "@/lib/markov/testSupport";
import { ruleTableModel, type Model } from "@/lib/models";
import { verifyCertificate, type Equation } from "@/lib/verify";
import { squareParts, tikzSquare } from "./tikzSquare";

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

  it("reads a projection from the base CA and from a supercell alike: source dynamics to the power T, then π ∘ B_N with the map's block", () => {
    const fromBase = tikzSquare({ kind: "projection", block: 3, steps: 3, source: { kind: "eca", rule: 146 }, target: { kind: "eca", rule: 128 } });
    expect(fromBase).toContain('"f_{146}^{3}"');
    expect(fromBase).toContain('"\\pi \\circ B_{3}"');
    const fromSupercell = tikzSquare({ kind: "projection", block: 2, steps: 4, source: { kind: "supercell", alphabet: 8 }, target: { kind: "eca", rule: 128 } });
    expect(fromSupercell).toContain('\\arrow[r, "F^{4}"]');
    expect(fromSupercell).toContain('"\\pi \\circ B_{2}"\'');
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

const base = { format: "squarely-certificate", version: 1 } as const;

describe("tikzSquare from a certificate draws the equation the checker evaluated", () => {
  it("draws the 3-cycle lumped by [0,0,1] at 3 steps as P^3 V = V Q (at 1 step the check fails)", () => {
    const cycle = { kind: "markov", labels: ["x", "y", "z"], matrix: [["0", "1", "0"], ["0", "0", "1"], ["1", "0", "0"]] };
    const target = { kind: "markov", labels: ["{x,y}", "{z}"], matrix: [["1", "0"], ["0", "1"]] };
    const at = (steps: number) => ({ ...base, map: { kind: "lumping", partition: [0, 0, 1], steps }, source: cycle, target });
    expect(verifyCertificate(at(3)).status).toBe("holds");
    expect(verifyCertificate(at(1)).status).toBe("fails");
    expect(squareParts({ kind: "lumping", source: { kind: "markov" }, target: { kind: "markov" }, certificate: at(3) })).toEqual({
      topLeft: "\\mathbb{R}^{3}",
      bottomLeft: "\\mathbb{R}^{2}",
      top: "P^{3}",
      bottom: "Q",
      down: "V_{\\pi}",
    });
  });

  it("names an iterate's target by its own table, not the base rule: ECA 110's 2-step iterate is f_{110}^2 = g", () => {
    const built = certifyIterate({ rule: 110, steps: 2 });
    if (!built.ok) throw new Error("expected a certificate");
    const parts = squareParts({ kind: "iterate", source: { kind: "eca", rule: 110 }, target: { kind: "eca", rule: 110 }, certificate: built.certificate });
    expect(parts.top).toBe("f_{110}^{2}");
    expect(parts.bottom).toBe("g");
    expect(parts.bottom).not.toContain("110");
  });

  it("draws a projection from a supercell source with the map's block and steps", () => {
    const source = { kind: "supercell", base: { kind: "eca", rule: 105 }, block: 2, steps: 2 };
    const cert = { ...base, map: { kind: "projection", block: 2, steps: 3, projection: [0, 1, 1, 0, 1, 0, 0, 1, 1, 0, 0, 1, 0, 1, 1, 0] }, source, target: { kind: "eca", rule: 150 } };
    const parts = squareParts({ kind: "projection", source: { kind: "supercell" }, target: { kind: "eca" }, certificate: JSON.stringify(cert) });
    expect(parts.top).toBe("(S_{2}[f_{105}^{2}])^{3}");
    expect(parts.down).toBe("\\pi \\circ B_{2}");
    expect(parts.topLeft).toBe("\\{0,\\dots,3\\}^{\\mathbb{Z}}");
  });
});

/** A drawn dynamics name read back into a tree, by a reader written here from the notation in FORMAT.md. */
type Drawn = { eca: number } | { ca: true } | { chain: true } | { power: number; of: Drawn } | { supercell: number; of: Drawn };

function readDynamics(tex: string): Drawn {
  const parenthesised = /^\((.*)\)\^\{(\d+)\}$/.exec(tex);
  if (parenthesised) return { power: Number(parenthesised[2]), of: readDynamics(parenthesised[1]) };
  const supercell = /^S_\{(\d+)\}\[(.*)\]$/.exec(tex);
  if (supercell) return { supercell: Number(supercell[1]), of: readDynamics(supercell[2]) };
  const powered = /^(.*)\^\{(\d+)\}$/.exec(tex);
  if (powered) return { power: Number(powered[2]), of: readDynamics(powered[1]) };
  const eca = /^[fg]_\{(\d+)\}$/.exec(tex);
  if (eca) return { eca: Number(eca[1]) };
  if (tex === "f" || tex === "g") return { ca: true };
  if (tex === "P" || tex === "Q") return { chain: true };
  throw new Error(`cannot read ${tex}`);
}

/** What a model's dynamics must read as: an n-step model is its base to the n (Model fields only). */
function expected(model: Model): Drawn {
  switch (model.kind) {
    case "eca":
      return { eca: model.rule };
    case "ca":
      return { ca: true };
    case "markov":
      return { chain: true };
    case "iterate":
    case "decimated":
      return raised(expected(model.base), model.steps);
    case "supercell":
      return { supercell: model.block, of: raised(expected(model.base), model.steps) };
  }
}
const raised = (x: Drawn, n: number): Drawn => (n === 1 ? x : { power: n, of: x });

function readDown(tex: string): { kind: string; block: number | null } {
  if (tex === "\\mathrm{id}") return { kind: "id", block: null };
  if (tex === "V_{\\pi}") return { kind: "lumping", block: null };
  if (tex === "\\pi") return { kind: "projection", block: 1 };
  const projection = /^\\pi \\circ B_\{(\d+)\}$/.exec(tex);
  if (projection) return { kind: "projection", block: Number(projection[1]) };
  const blocking = /^B_\{(\d+)\}$/.exec(tex);
  if (blocking) return { kind: "blocking", block: Number(blocking[1]) };
  throw new Error(`cannot read ${tex}`);
}

const rule = fc.integer({ min: 0, max: 255 });
const small = fc.integer({ min: 1, max: 3 });
const projectionOf = (states: number) => fc.array(fc.integer({ min: 0, max: 1 }), { minLength: states, maxLength: states }).map((p) => (p.includes(0) && p.includes(1) ? p : [1, ...p.slice(1).map(() => 0)]));

/** Certificates of every map kind and source kind, as the builders issue them or written by hand. */
const certificates: fc.Arbitrary<unknown> = fc.oneof(
  fc.tuple(rule, fc.integer({ min: 1, max: 3 }), small).chain(([r, N, T]) => projectionOf(2 ** N).map((p) => certifyProjection({ rule: r, block: N, steps: T, projection: p }))),
  fc.tuple(rule, fc.integer({ min: 1, max: 2 }), small, projectionOf(4)).map(([r, T0, T, p]) => {
    // Block 1 of the block-2 supercell of the rule, T0 base steps per supercell step.
    const check = checkProjection(supercellTable(ecaTable(r), 2, T0), 1, p, { steps: T });
    const source = { kind: "supercell", base: { kind: "eca", rule: r }, block: 2, steps: T0 };
    return check.ok ? { ok: true, certificate: { ...base, map: { kind: "projection", block: 1, steps: T, projection: p }, source, target: ruleTableModel(check.coarse) } } : { ok: false };
  }),
  fc.tuple(rule, fc.integer({ min: 1, max: 3 }), small).map(([r, N, T]) => certifyBlocking({ rule: r, block: N, steps: T })),
  fc.tuple(rule, small).map(([r, S]) => certifyIterate({ rule: r, steps: S })),
  fc.tuple(rule, small).map(([r, S]) => ({ ok: true, certificate: { ...base, map: { kind: "iterate", steps: S }, source: { kind: "eca", rule: r }, target: { kind: "iterate", base: { kind: "eca", rule: r }, steps: S } } })),
  fc.tuple(liftedChain(), small).map(([{ p, partition }, s]) => certifyLumping({ chain: { kind: "markov", matrix: formatMatrix(p) }, partition, steps: s })),
  fc.tuple(liftedChain(), small).map(([{ p }, s]) => certifyDecimation({ chain: { kind: "markov", matrix: formatMatrix(p) }, steps: s })),
  fc.tuple(liftedChain(), small, small).map(([{ p }, s, t]) => {
    const chain = { kind: "markov", labels: p.map((_, i) => `s${i}`), matrix: formatMatrix(p) };
    return { ok: true, certificate: { ...base, map: { kind: "decimation", steps: s * t }, source: { kind: "decimated", base: chain, steps: t }, target: { kind: "decimated", base: chain, steps: s * t * t } } };
  }),
).map((built) => ((built as { ok: boolean; certificate?: Certificate }).ok ? (built as { certificate: unknown }).certificate : null));

function alphabetOf(tex: string): number {
  if (tex === "\\{0,1\\}^{\\mathbb{Z}}") return 2;
  const k = /^\\\{0,\\dots,(\d+)\\\}\^\{\\mathbb\{Z\}\}$/.exec(tex);
  if (!k) throw new Error(`cannot read ${tex}`);
  return Number(k[1]) + 1;
}

function expectDrawnIs(parts: ReturnType<typeof squareParts>, equation: Equation) {
  expect(readDynamics(parts.top)).toEqual(raised(expected(equation.source), equation.steps));
  expect(readDynamics(parts.bottom)).toEqual(expected(equation.target));
  const down = readDown(parts.down);
  const kind = equation.kind === "decimation" || equation.kind === "iterate" ? "id" : equation.kind;
  expect(down.kind).toBe(kind);
  expect(down.block).toBe(equation.block);
  const { source, target } = equation;
  if (source.kind === "markov") expect(parts.topLeft).toBe(`\\mathbb{R}^{${source.matrix.length}}`);
  if (target.kind === "markov") expect(parts.bottomLeft).toBe(`\\mathbb{R}^{${target.matrix.length}}`);
  if (source.kind === "eca") expect(alphabetOf(parts.topLeft)).toBe(2);
  if (source.kind === "supercell" && source.base.kind === "eca") expect(alphabetOf(parts.topLeft)).toBe(2 ** source.block);
}

describe("property: for every certificate the checker says holds, the square drawn is the equation it evaluated", () => {
  it("reads the drawn powers, models, block and arrows back and finds the checker's equation", () => {
    let held = 0;
    fc.assert(
      fc.property(certificates, (cert) => {
        if (cert === null) return;
        const result = verifyCertificate(cert);
        if (result.status !== "holds") return;
        held++;
        expectDrawnIs(squareParts({ kind: "?", source: { kind: "?" }, target: { kind: "?" }, certificate: cert }), result.equation);
      }),
      { numRuns: 300 },
    );
    expect(held).toBeGreaterThan(100);
  });
});
