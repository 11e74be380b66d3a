import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { checkProjection, ecaRuleOf, ecaTable, supercellTable } from "@/lib/ca";
import { ruleTableModel } from "@/lib/models";
import { certifyIterate, certifyProjection, type Certificate } from "@/lib/certificate";
import { allOnes, parity } from "@/lib/ca/testSupport";
import { verifyCertificate } from "@/lib/verify";
import { complementCertificate, complementRule, complementTable, ecaSymmetryClasses, reflectCertificate, reflectRule, reflectTable, symmetryClass } from "./index";

const cert = (built: { ok: boolean; certificate?: Certificate }): Certificate => {
  if (!built.ok || !built.certificate) throw new Error("expected a certificate");
  return built.certificate;
};
const rules = fc.integer({ min: 0, max: 255 });

describe("ECA symmetries (common practice)", () => {
  it("split the 256 ECAs into 88 classes under reflection and complement", () => {
    const classes = ecaSymmetryClasses();
    expect(classes).toHaveLength(88);
    expect(classes.flatMap((c) => c.members).sort((a, b) => a - b)).toEqual(Array.from({ length: 256 }, (_, i) => i));
  });

  it("put rule 110 with 124, 137 and 193, and rule 30 with 86, 135 and 149", () => {
    expect([reflectRule(110), complementRule(110), reflectRule(complementRule(110))].sort()).toEqual([124, 137, 193]);
    expect(ecaSymmetryClasses().find((c) => c.representative === 30)?.members).toEqual([30, 86, 135, 149]);
    expect(symmetryClass(193)).toBe(110);
  });

  it("property: reflecting twice and complementing twice are the identity, and the two commute", () => {
    fc.assert(fc.property(rules, (r) => reflectRule(reflectRule(r)) === r && complementRule(complementRule(r)) === r && reflectRule(complementRule(r)) === complementRule(reflectRule(r))));
  });

  it("agree with the general table versions on every ECA", () => {
    for (let r = 0; r < 256; r++) {
      expect(ecaRuleOf(reflectTable(ecaTable(r)))).toBe(reflectRule(r));
      expect(ecaRuleOf(complementTable(ecaTable(r)))).toBe(complementRule(r));
    }
  });

  it("property: a block-2 projection commutes for f exactly when the reflected projection commutes for reflect(f)", () => {
    fc.assert(
      fc.property(rules, fc.constantFrom([0, 0, 0, 1], [0, 1, 1, 0], [0, 0, 1, 1], [0, 1, 0, 1], [0, 1, 1, 1], [0, 0, 1, 0]), (f, p) => {
        const reflected = [p[0], p[2], p[1], p[3]];
        const a = checkProjection(ecaTable(f), 2, p);
        const b = checkProjection(ecaTable(reflectRule(f)), 2, reflected);
        expect(b.ok).toBe(a.ok);
        if (a.ok && b.ok) expect(ecaRuleOf(b.coarse)).toBe(reflectRule(ecaRuleOf(a.coarse)!));
      }),
      { numRuns: 200 },
    );
  });
});

describe("reflected and complemented certificates, re-verified by the checker", () => {
  it("complement 146 → 128 at block 3 (Israeli & Goldenfeld) into 182 → 254 by 'not all zeros', which verifies", () => {
    const c = complementCertificate(cert(certifyProjection({ rule: 146, block: 3, projection: allOnes(3) })));
    expect(c.source).toEqual({ kind: "eca", rule: 182 });
    expect(c.target).toEqual({ kind: "eca", rule: 254 });
    expect(c.map.kind === "projection" && c.map.projection).toEqual([0, 1, 1, 1, 1, 1, 1, 1]);
    expect(verifyCertificate(c).status).toBe("holds");
  });

  it("reflect and complement 105 → 150 at block 2 and 110's 2-step iterate; every derived certificate verifies", () => {
    for (const base of [cert(certifyProjection({ rule: 105, block: 2, projection: parity(2) })), cert(certifyIterate({ rule: 110, steps: 2 }))])
      for (const derived of [reflectCertificate(base), complementCertificate(base), reflectCertificate(complementCertificate(base))])
        expect(verifyCertificate(derived).status).toBe("holds");
  });

  it("property: reflecting a certificate twice gives it back", () => {
    const c = cert(certifyProjection({ rule: 146, block: 3, projection: allOnes(3) }));
    expect(reflectCertificate(reflectCertificate(c))).toEqual(c);
    expect(complementCertificate(complementCertificate(c))).toEqual(c);
  });

  it("refuses a Markov certificate", () => {
    const c = { format: "squarely-certificate", version: 1, map: { kind: "decimation", steps: 2 }, source: { kind: "markov", labels: ["a"], matrix: [["1"]] }, target: { kind: "markov", labels: ["a"], matrix: [["1"]] } } as Certificate;
    expect(() => reflectCertificate(c)).toThrow(/cellular automata/);
  });
});

describe("symmetry images of projections from a supercell source", () => {
  it("reflect the cells inside each supercell symbol as well as the symbols' order: every image of a holding certificate holds", { timeout: 120_000 }, () => {
    let asymmetric = 0;
    // Every ECA (rule 12, "0100", was refused before), block 1 of its block-2 supercell: 4 symbols of two cells onto 2.
    for (let rule = 0; rule < 256; rule++)
      for (let code = 1; code < 15; code++) {
        const projection = [0, 1, 2, 3].map((s) => (code >> s) & 1);
        const check = checkProjection(supercellTable(ecaTable(rule), 2, 2), 1, projection, { steps: 1 });
        if (!check.ok) continue;
        const c = {
          format: "squarely-certificate",
          version: 1,
          map: { kind: "projection", block: 1, steps: 1, projection },
          source: { kind: "supercell", base: { kind: "eca", rule }, block: 2, steps: 2 },
          target: ruleTableModel(check.coarse),
        } as Certificate;
        expect(verifyCertificate(c).status).toBe("holds");
        // Cells "01" (symbol 1) and "10" (symbol 2) are each other's reflection.
        if (projection[1] !== projection[2]) asymmetric++;
        for (const image of [reflectCertificate(c), complementCertificate(c), reflectCertificate(complementCertificate(c))])
          expect(verifyCertificate(image).status, `rule ${rule}, projection ${projection.join("")}`).toBe("holds");
      }
    expect(asymmetric).toBeGreaterThan(0);
  });
});
