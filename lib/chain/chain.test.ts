import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { certifyDecimation, certifyLumping, certifyProjection, type Certificate } from "@/lib/certificate";
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
