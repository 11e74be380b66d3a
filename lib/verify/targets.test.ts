import { describe, expect, it } from "vitest";
import { certifyLumping, certifyProjection, sealCertificate, type Certificate } from "@/lib/certificate";
import { parity } from "@/lib/ca/testSupport";
import { verifyCertificate } from "./index";

const base = { format: "squarely-certificate", version: 1 } as const;
const weather = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };

describe("the labels of a target chain are checked (FORMAT.md, Targets)", () => {
  const absorbing = { kind: "markov", labels: ["a", "b"], matrix: [["1", "0"], ["1/2", "1/2"]] };
  // P² by hand: row b is (1/2·1 + 1/2·1/2, 1/2·1/2) = (3/4, 1/4).
  const squared = [["1", "0"], ["3/4", "1/4"]];

  it("refuses a decimation of P = [[1,0],[1/2,1/2]] by 2 onto a target with labels swapped, naming state 0", () => {
    const r = verifyCertificate({ ...base, map: { kind: "decimation", steps: 2 }, source: absorbing, target: { kind: "markov", labels: ["b", "a"], matrix: squared } });
    expect(r).toMatchObject({ status: "fails", counterexample: { kind: "label-mismatch", state: 0, claimed: "b", expected: "a" } });
    expect(verifyCertificate({ ...base, map: { kind: "decimation", steps: 2 }, source: absorbing, target: { kind: "markov", labels: ["a", "b"], matrix: squared } }).status).toBe("holds");
  });

  it("refuses the weather lumping (Grinstead & Snell Example 11.1) with its two target labels swapped, or renamed", () => {
    const target = (labels: string[]) => ({ kind: "markov", labels, matrix: [["3/4", "1/4"], ["1", "0"]] });
    const check = (labels: string[]) => verifyCertificate({ ...base, map: { kind: "lumping", partition: [0, 1, 0] }, source: weather, target: target(labels) });
    expect(check(["{R,S}", "{N}"]).status).toBe("holds");
    expect(check(["{N}", "{R,S}"])).toMatchObject({ status: "fails", counterexample: { kind: "label-mismatch", state: 0, claimed: "{N}", expected: "{R,S}" } });
    expect(check(["wet", "{N}"])).toMatchObject({ status: "fails", counterexample: { kind: "label-mismatch", state: 0, claimed: "wet" } });
    expect(check(["0", "1"]).status).toBe("fails");
  });
});

describe("the address names content, not an author", () => {
  it("says that an address identifies content and that anyone can recompute it, never that the certificate was changed after issue", () => {
    const c = certifyProjection({ rule: 105, block: 2, projection: parity(2) });
    if (!c.ok) throw new Error("expected a certificate");
    const other = { ...c.certificate, target: { kind: "eca", rule: 90 } };
    const r = verifyCertificate(other);
    expect(r.status).toBe("malformed");
    if (r.status === "malformed") {
      expect(r.issues[0].path).toBe("address");
      expect(r.issues[0].message).toMatch(/identifies content, not who issued it/);
      expect(r.issues[0].message).not.toMatch(/changed after|tampered|issued by/);
    }
  });
});

describe("iterate and blocking targets are compared by value", () => {
  it("holds for the 2-step iterate of ECA 51 onto the derived 2-step iterate of ECA 204 (51 is the complement, so both are the identity)", () => {
    const identity2 = { kind: "iterate", base: { kind: "eca", rule: 204 }, steps: 2 };
    expect(verifyCertificate({ ...base, map: { kind: "iterate", steps: 2 }, source: { kind: "eca", rule: 51 }, target: identity2 }).status).toBe("holds");
    // The identity at radius 2 written out: entry w is the centre bit of the 5-cell window, bit 2.
    const table = Array.from({ length: 32 }, (_, w) => (w >> 2) & 1);
    expect(verifyCertificate({ ...base, map: { kind: "iterate", steps: 2 }, source: { kind: "eca", rule: 51 }, target: { kind: "ca", k: 2, r: 2, table } }).status).toBe("holds");
    const wrong = verifyCertificate({ ...base, map: { kind: "iterate", steps: 2 }, source: { kind: "eca", rule: 51 }, target: { kind: "iterate", base: { kind: "eca", rule: 0 }, steps: 2 } });
    expect(wrong).toMatchObject({ status: "fails", counterexample: { kind: "table-entry-mismatch" } });
  });

  it("holds for blocking ECA 51 at block 2 onto the block-2 supercell of ECA 204 (two steps of 51 are the identity)", () => {
    const target = { kind: "supercell", base: { kind: "eca", rule: 204 }, block: 2 };
    expect(verifyCertificate({ ...base, map: { kind: "blocking", block: 2 }, source: { kind: "eca", rule: 51 }, target }).status).toBe("holds");
    expect(verifyCertificate({ ...base, map: { kind: "blocking", block: 2, steps: 1 }, source: { kind: "eca", rule: 51 }, target }).status).toBe("fails");
  });
});

describe("fails always means a counterexample exists; a wrong encoding is malformed", () => {
  it("calls the constant projection of ECA 105 at block 2 ([0,0,0,0]) malformed, naming map.projection", () => {
    const r = verifyCertificate({ ...base, map: { kind: "projection", block: 2, projection: [0, 0, 0, 0] }, source: { kind: "eca", rule: 105 }, target: { kind: "eca", rule: 0 } });
    expect(r).toMatchObject({ status: "malformed", issues: [{ path: "map.projection", message: expect.stringMatching(/constant projection/) }] });
  });

  it("calls ECA 204 at N = 1, T = 2 onto ECA 204 (radius 1) malformed, saying the coarse rule is written with r = 2; the same rule at radius 2 holds", () => {
    const map = { kind: "projection", block: 1, steps: 2, projection: [0, 1] };
    const r = verifyCertificate({ ...base, map, source: { kind: "eca", rule: 204 }, target: { kind: "eca", rule: 204 } });
    expect(r).toMatchObject({ status: "malformed", issues: [{ path: "target", message: expect.stringMatching(/write the target as a CA with k=2, r=2/) }] });
    const table = Array.from({ length: 32 }, (_, w) => (w >> 2) & 1);
    expect(verifyCertificate({ ...base, map, source: { kind: "eca", rule: 204 }, target: { kind: "ca", k: 2, r: 2, table } }).status).toBe("holds");
  });

  it("calls a lumping onto a chain with the wrong number of states malformed, not failed", () => {
    const built = certifyLumping({ chain: weather, partition: [0, 1, 0] });
    if (!built.ok) throw new Error("expected a certificate");
    const c: Certificate = sealCertificate({ ...built.certificate, target: { kind: "markov", labels: ["{R,N,S}"], matrix: [["1"]] } });
    expect(verifyCertificate(c)).toMatchObject({ status: "malformed", issues: [{ path: "target" }] });
  });
});
