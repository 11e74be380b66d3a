import { describe, expect, it } from "vitest";
import fc from "fast-check";
import Fraction from "fraction.js";
import { certificateText, certifyBlocking, certifyDecimation, certifyIterate, certifyLumping, certifyProjection, sealCertificate, type Certificate } from "@/lib/certificate";
import { allOnes, centreAfter, parity } from "@/lib/ca/testSupport";
import { CHECKER_VERSION, DEFAULT_LIMITS, verifyCertificate } from "./index";

const oz = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };
const cert = (built: { ok: boolean; certificate?: Certificate }): Certificate => {
  if (!built.ok || !built.certificate) throw new Error("expected a certificate");
  return built.certificate;
};
/** A certificate edited and resealed, as a dishonest or mistaken issuer would. */
const edited = (c: Certificate, edit: (c: Certificate) => void): Certificate => {
  const copy = structuredClone(c);
  edit(copy);
  return sealCertificate(copy);
};

describe("verifyCertificate: squares that hold", () => {
  it("holds for rule 105 → 150 at block 2 and 146 → 128 at block 3 (Israeli & Goldenfeld, PRL 92, 074105, 2004)", () => {
    for (const c of [cert(certifyProjection({ rule: 105, block: 2, projection: parity(2) })), cert(certifyProjection({ rule: 146, block: 3, projection: allOnes(3) }))]) {
      const result = verifyCertificate(c);
      expect(result.status).toBe("holds");
      if (result.status === "holds") {
        expect(result.address).toBe(c.address);
        expect(result.checkerVersion).toBe(CHECKER_VERSION);
      }
    }
  });

  it("holds for the pasted composites 105 → 150 at block 4 (parity of four) and 146 → 128 at block 6 (all six ones), written by hand", () => {
    const square = (rule: number, target: number, block: number, projection: number[]) => ({
      format: "squarely-certificate",
      version: 1,
      map: { kind: "projection", block, projection },
      source: { kind: "eca", rule },
      target: { kind: "eca", rule: target },
    });
    expect(verifyCertificate(square(105, 150, 4, parity(4))).status).toBe("holds");
    expect(verifyCertificate(square(146, 128, 6, allOnes(6))).status).toBe("holds");
  });

  it("holds for lumping, decimation, blocking and iterate certificates, and reads JSON text", () => {
    const all = [
      certifyLumping({ chain: oz, partition: [0, 1, 0] }),
      certifyLumping({ chain: oz, partition: [0, 1, 0], steps: 3 }),
      certifyDecimation({ chain: oz, steps: 5 }),
      certifyBlocking({ rule: 54, block: 3 }),
      certifyIterate({ rule: 110, steps: 3 }),
    ].map(cert);
    for (const c of all) expect(verifyCertificate(certificateText(c)).status, c.map.kind).toBe("holds");
  });

  it("accepts a derived target where one is the definition (decimated chain, supercell) and an explicit supercell table", () => {
    const base = { format: "squarely-certificate", version: 1 };
    expect(verifyCertificate({ ...base, map: { kind: "decimation", steps: 3 }, source: oz, target: { kind: "decimated", base: oz, steps: 3 } }).status).toBe("holds");
    const table = [0, 1, 1, 0, 1, 0, 0, 1].flatMap((x) => [x]);
    expect(verifyCertificate({ ...base, map: { kind: "iterate", steps: 1 }, source: { kind: "ca", k: 2, r: 1, table }, target: { kind: "eca", rule: 150 } }).status).toBe("holds");
  });
});

describe("verifyCertificate: squares that fail, with counterexamples re-checked independently", () => {
  it("finds the window where rule 105 at block 2 disagrees with a claimed rule 90, confirmed by string evolution", () => {
    const bad = edited(cert(certifyProjection({ rule: 105, block: 2, projection: parity(2) })), (c) => (c.target = { kind: "eca", rule: 90 }));
    const result = verifyCertificate(bad);
    expect(result.status).toBe("fails");
    if (result.status === "fails" && result.counterexample.kind === "coarse-rule-mismatch") {
      const cx = result.counterexample;
      expect(centreAfter(105, cx.cells, 2)).toBe(cx.imageCells);
      const coarse = cx.cells.map((b) => parity(2)[parseInt(b, 2)]);
      expect(coarse).toEqual(cx.coarseWindow);
      expect((90 >> (coarse[0] * 4 + coarse[1] * 2 + coarse[2])) & 1).toBe(cx.claimed);
      expect(parity(2)[parseInt(cx.imageCells, 2)]).toBe(cx.coarse);
      expect(cx.coarse).not.toBe(cx.claimed);
    } else expect.fail("expected a coarse-rule mismatch");
  });

  it("names the two states, the target block and both sums when a lumping is claimed that does not hold (Kemeny & Snell §6.3)", () => {
    const bad = edited(cert(certifyLumping({ chain: oz, partition: [0, 1, 0] })), (c) => {
      if (c.map.kind === "lumping") c.map.partition = [0, 0, 1];
    });
    const result = verifyCertificate(bad);
    expect(result.status === "fails" && result.counterexample).toEqual({ kind: "not-lumpable", block: 0, states: [0, 1], targetBlock: 0, sums: ["3/4", "1/2"] });
    // Independent re-check with fraction.js from the chain's own entries: block 0 = {R, N} under [0, 0, 1].
    if (result.status !== "fails" || result.counterexample.kind !== "not-lumpable") throw new Error("expected not-lumpable");
    const { states, targetBlock, sums } = result.counterexample;
    const into = (i: number) => oz.matrix[i].reduce((s, x, j) => ([0, 0, 1][j] === targetBlock ? s.add(new Fraction(x)) : s), new Fraction(0)).toFraction();
    expect(states.map(into)).toEqual(sums);
  });

  it("names the entry of a wrong lumped matrix and of a wrong matrix power", () => {
    const lumped = edited(cert(certifyLumping({ chain: oz, partition: [0, 1, 0] })), (c) => {
      if (c.target.kind === "markov") c.target.matrix = [["1/4", "3/4"], ["1", "0"]];
    });
    expect(verifyCertificate(lumped)).toMatchObject({ status: "fails", counterexample: { kind: "lumped-entry-mismatch", block: 0, targetBlock: 0, claimed: "1/4", actual: "3/4" } });
    const power = edited(cert(certifyDecimation({ chain: oz, steps: 2 })), (c) => {
      if (c.target.kind === "markov") c.target.matrix[1] = ["1/4", "3/8", "3/8"];
    });
    expect(verifyCertificate(power)).toMatchObject({ status: "fails", counterexample: { kind: "matrix-entry-mismatch", row: 1, column: 0, claimed: "1/4", actual: "3/8" } });
  });

  it("names the neighbourhood of a wrong iterate table and calls a supercell target of the wrong block malformed, naming the expected encoding", () => {
    const iterate = edited(cert(certifyIterate({ rule: 110, steps: 2 })), (c) => {
      if (c.target.kind === "ca") c.target.table[5] ^= 1;
    });
    expect(verifyCertificate(iterate)).toMatchObject({ status: "fails", counterexample: { kind: "table-entry-mismatch", neighbourhood: 5, cells: "0,0,1,0,1" } });
    const blocking = edited(cert(certifyBlocking({ rule: 110, block: 3 })), (c) => {
      if (c.target.kind === "supercell") c.target.block = 2;
    });
    expect(verifyCertificate(blocking)).toMatchObject({ status: "malformed", issues: [{ path: "target", message: expect.stringMatching(/write the target with k=8, r=1/) }] });
  });

  it("calls a claimed coarse CA of the wrong alphabet or radius malformed, naming the encoding expected (k=2, r=1)", () => {
    const bad = edited(cert(certifyProjection({ rule: 105, block: 2, projection: parity(2) })), (c) => (c.target = { kind: "ca", k: 2, r: 2, table: new Array(32).fill(0) }));
    expect(verifyCertificate(bad)).toMatchObject({ status: "malformed", issues: [{ path: "target", message: expect.stringMatching(/write the target as a CA with k=2, r=1/) }] });
  });
});

describe("verifyCertificate: malformed input, never a throw", () => {
  it("refuses a certificate with any one byte changed (every position of a 105 → 150 certificate)", () => {
    const text = certificateText(cert(certifyProjection({ rule: 105, block: 2, projection: parity(2) })));
    expect(verifyCertificate(text).status).toBe("holds");
    for (let i = 0; i < text.length; i++)
      for (const replacement of [text.charCodeAt(i) ^ 1, 0x30 + ((text.charCodeAt(i) + 1) % 10)]) {
        const changed = text.slice(0, i) + String.fromCharCode(replacement) + text.slice(i + 1);
        if (changed === text) continue;
        expect(verifyCertificate(changed).status, `byte ${i}: ${changed.slice(Math.max(0, i - 10), i + 10)}`).not.toBe("holds");
      }
  });

  it("says where it is wrong: not JSON, missing fields, unknown kinds, a model that is not stochastic", () => {
    expect(verifyCertificate("{")).toMatchObject({ status: "malformed", issues: [{ path: "", message: expect.stringMatching(/not JSON/) }] });
    const good = cert(certifyLumping({ chain: oz, partition: [0, 1, 0] }));
    const { address: _a, ...unsealed } = good;
    const paths = (v: unknown) => {
      const r = verifyCertificate(v);
      return r.status === "malformed" ? r.issues.map((i) => i.path) : [r.status];
    };
    expect(paths({ ...unsealed, map: { kind: "lumping" } })).toEqual(["map.partition"]);
    expect(paths({ ...unsealed, map: { kind: "shuffle" } })).toEqual(["map.kind"]);
    expect(paths({ ...unsealed, source: { ...oz, matrix: [["1/2", "1/2", "1/2"], ...oz.matrix.slice(1)] } })).toEqual(["source.matrix"]);
    expect(paths({ ...unsealed, map: { kind: "lumping", partition: [0, 1] } })).toEqual(["map.partition"]);
    expect(paths({ ...unsealed, map: { kind: "projection", block: 2, projection: [0, 1, 1, 0] } })).toEqual(["source", "target"]);
    expect(paths({ ...good, address: "sha256:" + "0".repeat(64) })).toEqual(["address"]);
  });

  it("property: never throws, whatever it is given", () => {
    const good = JSON.parse(certificateText(cert(certifyProjection({ rule: 105, block: 2, projection: parity(2) }))));
    fc.assert(
      fc.property(fc.oneof(fc.anything(), fc.json(), fc.constant(good).map((g) => ({ ...g, map: { ...g.map, projection: [0, 1] } }))), (v) => {
        const r = verifyCertificate(v);
        expect(["holds", "fails", "malformed", "too-large"]).toContain(r.status);
      }),
      { numRuns: 300 },
    );
  });

  it("does not mutate its input", () => {
    const c = cert(certifyLumping({ chain: oz, partition: [0, 1, 0] }));
    const before = structuredClone(c);
    verifyCertificate(c);
    expect(c).toEqual(before);
  });
});

describe("verifyCertificate: limits checked before any work", () => {
  const base = { format: "squarely-certificate", version: 1 };

  it("names the bound and the size asked: block 9 of an ECA is beyond the default block limit of 8", () => {
    const r = verifyCertificate({ ...base, map: { kind: "projection", block: 9, projection: new Array(512).fill(0).map((_, i) => i % 2) }, source: { kind: "eca", rule: 30 }, target: { kind: "eca", rule: 30 } });
    expect(r).toEqual({ status: "too-large", bound: "maxBlock", limit: 8, asked: 9 });
  });

  it("counts the windows of the exhaustive check: 2^12 at block 4 against a limit of 1000", () => {
    const c = cert(certifyProjection({ rule: 105, block: 2, projection: parity(2) }));
    const r = verifyCertificate({ ...c, address: undefined, map: { kind: "projection", block: 4, projection: parity(4) } }, { ...DEFAULT_LIMITS, maxWindows: 1000 });
    expect(r).toEqual({ status: "too-large", bound: "maxWindows", limit: 1000, asked: 4096 });
  });

  it("predicts the digits of P^k (at most k times the digits of the common denominator, here 4) and refuses a decimation whose result would be too long, at once", () => {
    // That no power is computed first is shown with a spy in bounds.test.ts; timing belongs in bench/.
    const r = verifyCertificate({ ...base, map: { kind: "decimation", steps: 1_000_000 }, source: oz, target: oz }, { ...DEFAULT_LIMITS, maxSteps: 10 ** 9 });
    expect(r).toMatchObject({ status: "too-large", bound: "maxDigits", asked: 1_000_000 });
  });

  it("refuses too many states", () => {
    const r = verifyCertificate({ ...base, map: { kind: "decimation", steps: 2 }, source: oz, target: oz }, { ...DEFAULT_LIMITS, maxStates: 2 });
    expect(r).toEqual({ status: "too-large", bound: "maxStates", limit: 2, asked: 3 });
  });
});
