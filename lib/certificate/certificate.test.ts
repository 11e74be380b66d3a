import { describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import {
  CertificateInputError,
  canonicalCertificate,
  certificateAddress,
  certificateJsonSchema,
  certificateSummary,
  certificateText,
  certifyBlocking,
  certifyDecimation,
  certifyIterate,
  certifyLumping,
  certifyProjection,
  parseProjectionString,
  type Certificate,
} from "./index";
import fc from "fast-check";
import { allOnes, parity } from "@/lib/ca/testSupport";
import { formatMatrix } from "@/lib/markov";
import { liftedChain } from "@/lib/markov/testSupport";

const oz = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };
const cert = (built: { ok: boolean; certificate?: Certificate }) => {
  if (!built.ok || !built.certificate) throw new Error("expected a certificate");
  return built.certificate;
};

describe("certificate builders", () => {
  it("certify rule 105 → 150 at block 2 by parity (Israeli & Goldenfeld 2004) with the coarse rule derived", () => {
    const c = cert(certifyProjection({ rule: 105, block: 2, projection: "0110" }));
    expect(c.source).toEqual({ kind: "eca", rule: 105 });
    expect(c.target).toEqual({ kind: "eca", rule: 150 });
    expect(c.map).toEqual({ kind: "projection", block: 2, steps: 2, projection: [0, 1, 1, 0] });
  });

  it("certify rule 146 → 128 at block 3 by all-ones (Israeli & Goldenfeld 2006)", () => {
    expect(cert(certifyProjection({ rule: 146, block: 3, projection: allOnes(3) })).target).toEqual({ kind: "eca", rule: 128 });
  });

  it("return the counterexample instead of a certificate when no coarse rule exists", () => {
    const built = certifyProjection({ rule: 30, block: 2, projection: parity(2) });
    expect(built.ok).toBe(false);
    if (!built.ok) expect(built.counterexample.kind).toBe("not-a-function");
  });

  it("lump the Grinstead & Snell Example 11.1 chain by {R,S}|{N} to [[3/4,1/4],[1,0]] (Kemeny & Snell §6.3)", () => {
    const c = cert(certifyLumping({ chain: oz, partition: [0, 1, 0] }));
    expect(c.target).toEqual({ kind: "markov", labels: ["{R,S}", "{N}"], matrix: [["3/4", "1/4"], ["1", "0"]] });
    const refused = certifyLumping({ chain: oz, partition: [0, 0, 1] });
    expect(refused.ok).toBe(false);
  });

  it("decimate the weather chain by 2 to its two-step matrix (Grinstead & Snell Example 11.1)", () => {
    const c = cert(certifyDecimation({ chain: oz, steps: 2 }));
    expect(c.target).toEqual({ kind: "markov", labels: ["R", "N", "S"], matrix: [["7/16", "3/16", "3/8"], ["3/8", "1/4", "3/8"], ["3/8", "3/16", "7/16"]] });
  });

  it("block and iterate a CA", () => {
    expect(cert(certifyBlocking({ rule: 110, block: 3 })).target).toEqual({ kind: "supercell", base: { kind: "eca", rule: 110 }, block: 3, steps: 3 });
    const it2 = cert(certifyIterate({ rule: 90, steps: 2 })).target;
    expect(it2.kind === "ca" && [it2.k, it2.r, it2.table.length]).toEqual([2, 2, 32]);
  });

  it("refuse bad input with a typed error naming the field", () => {
    expect(() => certifyProjection({ rule: 105, block: 2, projection: "01x0" })).toThrow(/projection/);
    expect(() => certifyProjection({ rule: 105, block: 2, projection: "0220" })).toThrow(/every coarse symbol/);
    expect(() => certifyProjection({ block: 2, projection: "0110" })).toThrow(/rule/);
    expect(() => parseProjectionString("")).toThrow(/projection/);
  });

  it("do not mutate their inputs", () => {
    const chain = structuredClone(oz);
    const projection = [0, 1, 1, 0];
    certifyLumping({ chain, partition: [0, 1, 0] });
    certifyProjection({ rule: 105, block: 2, projection });
    expect(chain).toEqual(oz);
    expect(projection).toEqual([0, 1, 1, 0]);
  });
});

describe("certificate identity (RFC 8785 + SHA-256)", () => {
  it("is sha256 of the JCS form without the seal, computed independently with node:crypto", () => {
    const c = cert(certifyProjection({ rule: 105, block: 2, projection: "0110" }));
    const { address, ...content } = c;
    expect(address).toBe(`sha256:${createHash("sha256").update(canonicalize(content) as string).digest("hex")}`);
    expect(certificateAddress(c)).toBe(address);
  });

  it("is the same for two spellings of the same certificate", () => {
    const c = cert(certifyDecimation({ chain: oz, steps: 1 }));
    const respelled = JSON.parse(JSON.stringify(c).replaceAll('"1/2"', '"0.5"'));
    delete respelled.address;
    expect(JSON.stringify(respelled)).toContain("0.5");
    expect(certificateAddress(respelled)).toBe(c.address);
  });

  it("renumbers the partition by first appearance (FORMAT.md, Identity): [1,0,1] and [0,1,0] are one certificate with one address", () => {
    const spelled = (partition: number[]) => ({
      format: "squarely-certificate",
      version: 1,
      map: { kind: "lumping", partition },
      source: oz,
      target: { kind: "markov", labels: ["{R,S}", "{N}"], matrix: [["3/4", "1/4"], ["1", "0"]] },
    });
    expect(canonicalCertificate(spelled([1, 0, 1])).map).toEqual({ kind: "lumping", partition: [0, 1, 0], steps: 1 });
    expect(certificateAddress(spelled([1, 0, 1]))).toBe(certificateAddress(spelled([0, 1, 0])));
    expect(certificateAddress(spelled([7, 3, 7]))).toBe(cert(certifyLumping({ chain: oz, partition: [0, 1, 0] })).address);
  });

  it("is written as canonical JSON with no insignificant whitespace", () => {
    const text = certificateText(cert(certifyProjection({ rule: 146, block: 3, projection: allOnes(3) })));
    expect(text).toBe(canonicalize(JSON.parse(text)));
    expect(text).not.toMatch(/\s/);
  });
});

describe("certificate schema", () => {
  it("exports a JSON Schema naming the format and version", () => {
    const schema = JSON.stringify(certificateJsonSchema());
    expect(schema).toContain("squarely-certificate");
    expect(schema).toContain('"additionalProperties":false');
  });

  it("refuses unknown versions and keys with paths", () => {
    const c = cert(certifyProjection({ rule: 105, block: 2, projection: "0110" }));
    const issues = (v: unknown) => {
      try {
        canonicalCertificate(v);
        return [];
      } catch (e) {
        return e instanceof CertificateInputError ? e.issues.map((i) => i.path) : ["?"];
      }
    };
    expect(issues({ ...c, version: 2 })).toEqual(["version"]);
    expect(issues({ ...c, extra: 1 })).toEqual([""]);
    expect(issues({ ...c, map: { ...c.map, block: 0 } })).toEqual(["map.block"]);
    expect(issues({ ...c, source: { kind: "markov", matrix: [["1/2"]] } })).toEqual(["source.matrix"]);
  });

  it("summarises a certificate in one line", () => {
    expect(certificateSummary(cert(certifyProjection({ rule: 105, block: 2, projection: "0110" }))).text).toBe(
      "ECA 105 → ECA 150: projection at block 2, 2 steps",
    );
    expect(certificateSummary(cert(certifyLumping({ chain: oz, partition: [0, 1, 0] }))).text).toBe(
      "Markov chain (3 states) → Markov chain (2 states): lumping into 2 blocks",
    );
  });
});

describe("no input is mutated (fast-check property)", () => {
  it("leaves rule tables, projections, chains and partitions as they were", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 255 }),
        fc.integer({ min: 1, max: 3 }).chain((N) => fc.tuple(fc.constant(N), fc.array(fc.integer({ min: 0, max: 1 }), { minLength: 2 ** N, maxLength: 2 ** N }))),
        (rule, [block, projection]) => {
          const proj = projection.includes(0) && projection.includes(1) ? projection : [1, ...projection.slice(1).map(() => 0)];
          const table = { k: 2, r: 1, table: Array.from({ length: 8 }, (_, i) => (rule >> i) & 1) };
          const [projBefore, tableBefore] = [structuredClone(proj), structuredClone(table)];
          certifyProjection({ table, block, projection: proj });
          certifyBlocking({ table, block });
          expect(proj).toEqual(projBefore);
          expect(table).toEqual(tableBefore);
        },
      ),
      { numRuns: 60 },
    );
    fc.assert(
      fc.property(liftedChain(), fc.integer({ min: 1, max: 3 }), ({ p, partition }, steps) => {
        const chain = { kind: "markov", matrix: formatMatrix(p) };
        const [chainBefore, partitionBefore] = [structuredClone(chain), [...partition]];
        certifyLumping({ chain, partition, steps });
        certifyDecimation({ chain, steps });
        expect(chain).toEqual(chainBefore);
        expect(partition).toEqual(partitionBefore);
      }),
      { numRuns: 40 },
    );
  });
});
