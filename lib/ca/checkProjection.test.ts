import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { CaInputError, checkProjection, ecaRuleOf, ecaTable, supercellTable, type ProjectionCounterexample, type WindowWitness } from "./index";
import { allOnes, centreAfter, parity } from "./testSupport";

const ruleOf = (check: ReturnType<typeof checkProjection>) => (check.ok ? ecaRuleOf(check.coarse) : null);

/** Re-checks a witness with the string evaluator of testSupport, never the core's tables. */
function confirmWitness(rule: number, N: number, T: number, proj: number[], w: WindowWitness): void {
  const image = centreAfter(rule, w.cells, T);
  expect(image).toBe(w.imageCells);
  expect(w.cells.map((c) => proj[parseInt(c, 2)])).toEqual(w.coarseWindow);
  expect(proj[parseInt(image, 2)]).toBe(w.coarse);
}
function confirmCounterexample(rule: number, N: number, T: number, proj: number[], c: ProjectionCounterexample, claimed?: number): void {
  if (c.kind === "not-a-function") {
    confirmWitness(rule, N, T, proj, c.first);
    confirmWitness(rule, N, T, proj, c.second);
    expect(c.first.coarseWindow).toEqual(c.second.coarseWindow);
    expect(c.first.coarse).not.toBe(c.second.coarse);
  } else {
    confirmWitness(rule, N, T, proj, c);
    expect(c.coarse).not.toBe(c.claimed);
    if (claimed !== undefined) {
      const [a, b, cc] = c.coarseWindow;
      expect((claimed >> (4 * a + 2 * b + cc)) & 1).toBe(c.claimed);
    }
  }
}

describe("checkProjection: published coarse-grainings (Israeli & Goldenfeld, PRL 92, 074105, 2004; PRE 73, 026203, 2006)", () => {
  it("rule 105 coarse-grains onto rule 150 at block 2 by the parity of the block", () => {
    expect(ruleOf(checkProjection(ecaTable(105), 2, parity(2)))).toBe(150);
  });

  it("rule 146 coarse-grains onto rule 128 at block 3 by 'the block is all ones'", () => {
    expect(ruleOf(checkProjection(ecaTable(146), 3, allOnes(3)))).toBe(128);
  });

  it("composite by pasting (DOMAIN.md §3): rule 105 onto 150 at block 4 by the parity of four cells, checked directly", () => {
    expect(ruleOf(checkProjection(ecaTable(105), 4, parity(4)))).toBe(150);
  });

  it("composite by pasting (DOMAIN.md §3): rule 146 onto 128 at block 6 by 'all six cells are one', checked directly", () => {
    expect(ruleOf(checkProjection(ecaTable(146), 6, allOnes(6)))).toBe(128);
  });

  it("accepts the claimed coarse rule when it is right and counts every window", () => {
    const check = checkProjection(ecaTable(105), 2, parity(2), { target: ecaTable(150) });
    expect(check.ok && check.windows).toBe(64);
  });
});

describe("checkProjection counterexamples, re-checked by an independent string evaluation", () => {
  it("shows two windows with equal coarse inputs and different outputs when no coarse rule exists (rule 30, parity, block 2)", () => {
    const check = checkProjection(ecaTable(30), 2, parity(2));
    expect(check.ok).toBe(false);
    if (!check.ok) {
      expect(check.counterexample.kind).toBe("not-a-function");
      confirmCounterexample(30, 2, 2, parity(2), check.counterexample);
    }
  });

  it("shows the window and both coarse values when the claimed rule is wrong (105 → 90 claimed)", () => {
    const check = checkProjection(ecaTable(105), 2, parity(2), { target: ecaTable(90) });
    expect(check.ok).toBe(false);
    if (!check.ok) {
      expect(check.counterexample.kind).toBe("coarse-rule-mismatch");
      confirmCounterexample(105, 2, 2, parity(2), check.counterexample, 90);
    }
  });

  it("property: flipping one entry of a valid projection either still commutes or fails with a confirmed counterexample", () => {
    const cases = [
      { rule: 105, N: 2, proj: parity(2) },
      { rule: 105, N: 3, proj: parity(3) },
      { rule: 146, N: 3, proj: allOnes(3) },
    ];
    fc.assert(
      fc.property(fc.constantFrom(...cases), fc.nat(), ({ rule, N, proj }, i) => {
        const flipped = proj.slice();
        flipped[i % flipped.length] ^= 1;
        const check = checkProjection(ecaTable(rule), N, flipped);
        if (!check.ok) confirmCounterexample(rule, N, N, flipped, check.counterexample);
        else {
          // Independently confirm the derived rule on every window.
          for (let w = 0; w < 2 ** (3 * N); w++) {
            const bits = w.toString(2).padStart(3 * N, "0");
            const blocks = [bits.slice(0, N), bits.slice(N, 2 * N), bits.slice(2 * N)];
            const [a, b, c] = blocks.map((x) => flipped[parseInt(x, 2)]);
            expect(check.coarse.table[a * 4 + b * 2 + c]).toBe(flipped[parseInt(centreAfter(rule, blocks, N), 2)]);
          }
        }
      }),
      { numRuns: 40 },
    );
  });
});

describe("checkProjection input checks", () => {
  it("refuses a projection that does not use every coarse symbol or has the wrong length", () => {
    expect(() => checkProjection(ecaTable(105), 2, [0, 2, 0, 2])).toThrow(CaInputError);
    expect(() => checkProjection(ecaTable(105), 2, [0, 1, 0])).toThrow(/expected 4 entries/);
  });

  it("refuses a claimed coarse rule of the wrong shape", () => {
    expect(() => checkProjection(ecaTable(105), 2, parity(2), { target: { k: 3, r: 1, table: new Uint8Array(27) } })).toThrow(/claimed coarse rule/);
  });

  it("does not mutate the projection or the rule", () => {
    const proj = parity(3);
    const t = ecaTable(105);
    checkProjection(t, 3, proj);
    expect(proj).toEqual(parity(3));
    expect(ecaRuleOf(t)).toBe(105);
  });
});

describe("checkProjection with a supercell table given by the caller", () => {
  it("gives the same verdicts as building the table itself, and refuses a table of the wrong shape", () => {
    const t = ecaTable(105);
    const F = supercellTable(t, 2);
    // rule 105 → rule 150 at block 2 (Israeli & Goldenfeld, Phys. Rev. Lett. 92, 074105, 2004) and a failing projection
    for (const proj of [[0, 1, 1, 0], [0, 0, 0, 1], [0, 1, 2, 3]]) expect(checkProjection(t, 2, proj, { supercell: F })).toEqual(checkProjection(t, 2, proj));
    expect(() => checkProjection(t, 2, [0, 1, 1, 0], { supercell: supercellTable(t, 3) })).toThrow(/supercell/);
  });
});
