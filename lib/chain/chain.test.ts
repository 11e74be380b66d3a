import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { certifyBlocking, certifyDecimation, certifyIterate, certifyLumping, certifyProjection, sealCertificate, type Certificate } from "@/lib/certificate";
import { allOnes, parity } from "@/lib/ca/testSupport";
import { liftedChain } from "@/lib/markov/testSupport";
import { formatMatrix } from "@/lib/markov";
import { DEFAULT_LIMITS } from "@/lib/verify";
import { composeChain } from "./index";

const cert = (built: { ok: boolean; certificate?: Certificate }): Certificate => {
  if (!built.ok || !built.certificate) throw new Error("expected a certificate");
  return built.certificate;
};
const composite = (certs: Certificate[]) => {
  const r = composeChain(certs);
  if (!r.ok) throw new Error(r.reason);
  return r;
};
const p105 = cert(certifyProjection({ rule: 105, block: 2, projection: parity(2) }));
const p150 = cert(certifyProjection({ rule: 150, block: 2, projection: parity(2) }));

describe("composeChain: pasting squares (DOMAIN.md §3)", () => {
  it("pastes 105 → 150 (block 2, parity) and 150 → 150 (block 2, parity) into 105 → 150 at block 4 by the parity of four cells", () => {
    const r = composite([p105, p150]);
    expect(r.verification).toBe("links+composite");
    expect(r.composite.map).toEqual({ kind: "projection", block: 4, steps: 4, projection: parity(4) });
    expect(r.composite.target).toEqual({ kind: "eca", rule: 150 });
  });

  it("pastes 146 → 128 (block 3, all ones) and 128 → 128 (block 2, all ones) into 146 → 128 at block 6 by 'all six cells are one'", () => {
    const p128 = cert(certifyProjection({ rule: 128, block: 2, projection: allOnes(2) }));
    const r = composite([cert(certifyProjection({ rule: 146, block: 3, projection: allOnes(3) })), p128]);
    expect(r.composite.map).toEqual({ kind: "projection", block: 6, steps: 6, projection: allOnes(6) });
    expect(r.verification).toBe("links+composite");
  });

  it("checks only the links when the composite is beyond the limits, and says so", () => {
    const r = composeChain([p105, p150, p150], { ...DEFAULT_LIMITS, maxWindows: 2 ** 20 });
    expect(r.ok && r.verification).toBe("links");
    expect(r.ok && r.composite.map.kind === "projection" && r.composite.map.block).toBe(8);
  });

  it("names the link whose target does not meet the next link's source", () => {
    const r = composeChain([p105, cert(certifyProjection({ rule: 146, block: 3, projection: allOnes(3) }))]);
    expect(r).toMatchObject({ ok: false, link: 0, reason: expect.stringMatching(/ends at ECA 150, but link 2 starts at ECA 146/) });
  });

  it("names a link that does not verify", () => {
    const broken = { ...p150, target: { kind: "eca", rule: 90 } } as Certificate;
    expect(composeChain([p105, broken])).toMatchObject({ ok: false, link: 1 });
  });

  it("says in words why a link's square fails, and hands over the checker's counterexample for a page to draw", () => {
    // 150 → 90 by block parity is false: on the blocks 00|01|00, two steps of rule 150 (x₋₁ ⊕ x₀ ⊕ x₁) turn the
    // centre block into 01 (parity 1), while rule 90 (x₋₁ ⊕ x₁) on the parities 0 1 0 gives 0 (worked by hand).
    const wrong = sealCertificate({ ...p150, target: { kind: "eca", rule: 90 } } as Certificate);
    const r = composeChain([p105, wrong]);
    expect(r).toMatchObject({
      ok: false,
      link: 1,
      counterexample: { kind: "coarse-rule-mismatch", cells: ["00", "01", "00"], imageCells: "01", coarse: 1, coarseWindow: [0, 1, 0], claimed: 0 },
    });
    expect(!r.ok && r.reason).toBe(
      "link 2 does not verify: the square does not commute: for some fine window, the projected centre block after the fine steps differs from what the coarse rule gives",
    );
  });

  it("composes lumping with decimation: the Grinstead & Snell Example 11.1 chain lumped by {R,S}|{N}, then squared", () => {
    const oz = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };
    const lump = cert(certifyLumping({ chain: oz, partition: [0, 1, 0] }));
    const square = cert(certifyDecimation({ chain: lump.target, steps: 2 }));
    const r = composite([lump, square]);
    expect(r.composite.map).toEqual({ kind: "lumping", partition: [0, 1, 0], steps: 2 });
    // [[3/4,1/4],[1,0]]^2 = [[13/16,3/16],[3/4,1/4]], by hand.
    expect(r.composite.target.kind === "markov" && r.composite.target.matrix).toEqual([["13/16", "3/16"], ["3/4", "1/4"]]);
    expect(r.verification).toBe("links+composite");
  });

  it("property: composition is associative (lumping, decimations, and projections)", () => {
    fc.assert(
      fc.property(liftedChain(), fc.integer({ min: 1, max: 3 }), fc.integer({ min: 1, max: 3 }), ({ p, partition }, k, l) => {
        const chain = { kind: "markov", matrix: formatMatrix(p) };
        const a = cert(certifyLumping({ chain, partition }));
        const b = cert(certifyDecimation({ chain: a.target, steps: k }));
        const c = cert(certifyDecimation({ chain: b.target, steps: l }));
        const left = composite([composite([a, b]).composite, c]).composite;
        const right = composite([a, composite([b, c]).composite]).composite;
        expect(left.address).toBe(right.address);
        expect(composite([a, b, c]).composite.address).toBe(left.address);
      }),
      { numRuns: 15 },
    );
    const left = composite([composite([p105, p150]).composite, p150]).composite;
    const right = composite([p105, composite([p150, p150]).composite]).composite;
    expect(left.address).toBe(right.address);
  });

  it("does not mutate the certificates it is given", () => {
    const before = structuredClone([p105, p150]);
    composeChain([p105, p150]);
    expect([p105, p150]).toEqual(before);
  });
});

/** Independent of composePair: a 4-cell block as a bit string, each half projected by p, the pair by q (left half first). */
function pastedByHand(p: string, q: string): number[] {
  return Array.from({ length: 16 }, (_, s) => {
    const cells = s.toString(2).padStart(4, "0");
    const left = p[parseInt(cells.slice(0, 2), 2)];
    const right = p[parseInt(cells.slice(2), 2)];
    return Number(q[parseInt(left + right, 2)]);
  });
}

describe("composeChain: every pair of kinds whose composite is a known map (FORMAT.md, Pasting)", () => {
  it("pastes ECA 10 → 187 at block 2 by 1100 and 187 → 170 at block 2 by 0010 into one block-4 projection, left sub-block first", () => {
    const first = cert(certifyProjection({ rule: 10, block: 2, projection: "1100" }));
    expect(first.target).toEqual({ kind: "eca", rule: 187 });
    const second = cert(certifyProjection({ rule: 187, block: 2, projection: "0010" }));
    expect(second.target).toEqual({ kind: "eca", rule: 170 });
    const r = composite([first, second]);
    expect(r.composite.map).toEqual({ kind: "projection", block: 4, steps: 4, projection: pastedByHand("1100", "0010") });
    expect(r.composite.target).toEqual({ kind: "eca", rule: 170 });
    expect(r.verification).toBe("links+composite");
  });

  it("pastes a projection whose steps differ from its block with an iterate (ECA 204, block 3, 1 step, then 3 steps): the radius-3 end is narrowed to radius 1", () => {
    const project = cert(certifyProjection({ rule: 204, block: 3, steps: 1, projection: parity(3) }));
    expect(project.target).toEqual({ kind: "eca", rule: 204 });
    const r = composite([project, cert(certifyIterate({ rule: 204, steps: 3 }))]);
    expect(r.composite.map).toEqual({ kind: "projection", block: 3, steps: 3, projection: parity(3) });
    expect(r.composite.target).toEqual({ kind: "eca", rule: 204 });
    expect(r.verification).toBe("links+composite");
  });

  it("pastes blocking ECA 105 at block 2 with the parity projection of its supercell onto ECA 150 into the block-2 projection of 105", () => {
    const block = cert(certifyBlocking({ rule: 105, block: 2 }));
    const project = { format: "squarely-certificate", version: 1, map: { kind: "projection", block: 1, steps: 1, projection: parity(2) }, source: block.target, target: { kind: "eca", rule: 150 } } as Certificate;
    const r = composite([block, project]);
    expect(r.composite.map).toEqual({ kind: "projection", block: 2, steps: 2, projection: parity(2) });
    expect(r.composite.target).toEqual({ kind: "eca", rule: 150 });
    expect(r.verification).toBe("links+composite");
  });

  it("pastes iterate then blocking, blocking then blocking, and a projection then a blocking; each composite verifies directly", () => {
    const it2 = cert(certifyIterate({ rule: 90, steps: 2 }));
    const r1 = composite([it2, cert(certifyBlocking({ table: { k: 2, r: 2, table: it2.target.kind === "ca" ? it2.target.table : [] }, block: 2, steps: 1 }))]);
    expect(r1.composite.map).toEqual({ kind: "blocking", block: 2, steps: 2 });
    expect(r1.verification).toBe("links+composite");
    const b2 = cert(certifyBlocking({ rule: 30, block: 2 }));
    const bb = { format: "squarely-certificate", version: 1, map: { kind: "blocking", block: 2, steps: 1 }, source: b2.target, target: { kind: "supercell", base: b2.target, block: 2, steps: 1 } } as Certificate;
    const r2 = composite([b2, bb]);
    expect(r2.composite.map).toEqual({ kind: "blocking", block: 4, steps: 2 });
    expect(r2.verification).toBe("links+composite");
    const pb = { format: "squarely-certificate", version: 1, map: { kind: "blocking", block: 2, steps: 2 }, source: { kind: "eca", rule: 150 }, target: { kind: "supercell", base: { kind: "eca", rule: 150 }, block: 2, steps: 2 } } as Certificate;
    const r3 = composite([p105, pb]);
    // Block of 4 cells → supercell symbol (parity of the left pair, parity of the right pair) read as two binary digits.
    const byHand = Array.from({ length: 16 }, (_, s) => {
      const bits = s.toString(2).padStart(4, "0");
      return 2 * ((Number(bits[0]) + Number(bits[1])) % 2) + ((Number(bits[2]) + Number(bits[3])) % 2);
    });
    expect(r3.composite.map).toEqual({ kind: "projection", block: 4, steps: 4, projection: byHand });
    expect(r3.verification).toBe("links+composite");
  });

  it("composes two lumpings: a 4-state chain by [0,0,1,2], then by [0,1,1], is the lumping by [0,0,1,1] onto [[1/2,1/2],[1/3,2/3]]", () => {
    // Built by hand: P lumps onto Q by {a,b}|{c}|{d}; Q lumps onto R by {q0}|{q1,q2}.
    const P = { kind: "markov", labels: ["a", "b", "c", "d"], matrix: [["1/4", "1/4", "1/4", "1/4"], ["1/2", "0", "1/4", "1/4"], ["1/6", "1/6", "1/3", "1/3"], ["0", "1/3", "1/2", "1/6"]] };
    const first = cert(certifyLumping({ chain: P, partition: [0, 0, 1, 2] }));
    expect(first.target.kind === "markov" && first.target.matrix).toEqual([["1/2", "1/4", "1/4"], ["1/3", "1/3", "1/3"], ["1/3", "1/2", "1/6"]]);
    const second = cert(certifyLumping({ chain: first.target, partition: [0, 1, 1] }));
    const r = composite([first, second]);
    expect(r.composite.map).toEqual({ kind: "lumping", partition: [0, 0, 1, 1], steps: 1 });
    expect(r.composite.target).toEqual({ kind: "markov", labels: ["{a,b}", "{c,d}"], matrix: [["1/2", "1/2"], ["1/3", "2/3"]] });
    expect(r.verification).toBe("links+composite");
  });

  it("still refuses a chain that mixes a Markov map with a CA map", () => {
    const oz = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };
    const r = composeChain([cert(certifyDecimation({ chain: oz, steps: 2 })), p105]);
    expect(r.ok).toBe(false);
  });
});
