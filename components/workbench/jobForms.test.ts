import { describe, expect, it } from "vitest";
import { LumpLargeChainParams } from "@/server/jobs/kinds/lump-large-chain.compute";
import { TotalisticAtlasParams } from "@/server/jobs/kinds/totalistic-atlas.compute";
import { EcaAtlasParams } from "@/server/jobs/kinds/eca-atlas.compute";
import { SearchProjectionParams } from "@/server/jobs/kinds/search-projection.compute";
import { TOTALISTIC_CODES } from "@/lib/discovery/totalisticAtlas";
import { certificateAddress, certifyLumping, certifyProjection, type Certificate } from "@/lib/certificate";
import { composeChain } from "@/lib/chain";
import { DEFAULT_LIMITS } from "@/lib/verify";
import { runVerifyTask, type BuildRequest } from "@/server/atlas/verify-task";
import { VerifyChainParams } from "@/server/jobs/kinds/verify-chain.compute";
import { VerifyMapParams } from "@/server/jobs/kinds/verify-map.compute";
import { DEFAULT_FIELDS, jobParams } from "./jobForms";
import { moveLink, verifyChainParams, verifyMapParams, type PickedMap } from "./mapJobForms";

// The forms' params are checked against the job kinds' own zod schemas, which the server applies.
describe("the totalistic atlas form", () => {
  it("gives params the job accepts, from its defaults and from a chosen range", () => {
    const fromDefaults = jobParams("totalistic-atlas", DEFAULT_FIELDS["totalistic-atlas"]);
    expect(TotalisticAtlasParams.parse(fromDefaults.params)).toEqual({ minCode: 0, maxCode: TOTALISTIC_CODES - 1, blocks: [1, 2] });
    const chosen = jobParams("totalistic-atlas", { minCode: "12", maxCode: "40", blocks: "2" });
    expect(TotalisticAtlasParams.parse(chosen.params)).toEqual({ minCode: 12, maxCode: 40, blocks: [2] });
  });

  it("names the field at fault: a code past the last one, a range backwards, no block size", () => {
    expect(jobParams("totalistic-atlas", { minCode: "0", maxCode: String(TOTALISTIC_CODES), blocks: "1" }).errors).toHaveProperty("maxCode");
    expect(jobParams("totalistic-atlas", { minCode: "9", maxCode: "3", blocks: "1" }).errors.maxCode).toBe("At least the first code.");
    const none = jobParams("totalistic-atlas", { minCode: "0", maxCode: "3", blocks: "" });
    expect(none).toEqual({ params: null, errors: { blocks: "Choose block 1, block 2 or both." } });
  });
});

describe("the ECA atlas form", () => {
  it("reaches the N = 9 smallest-block table for partitions alone, as the job's schema does, and stops projections at 5", () => {
    const n9 = jobParams("eca-atlas", { minBlock: "2", maxBlock: "9", search: "partitions" });
    expect(EcaAtlasParams.parse(n9.params)).toEqual({ minBlock: 2, maxBlock: 9, search: "partitions" });
    expect(jobParams("eca-atlas", { minBlock: "2", maxBlock: "9", search: "both" }).errors).toEqual({ maxBlock: "A whole number from 2 to 5." });
    expect(EcaAtlasParams.safeParse({ minBlock: 2, maxBlock: 9, search: "both" }).success).toBe(false);
    expect(jobParams("eca-atlas", { minBlock: "2", maxBlock: "10", search: "partitions" }).errors).toEqual({ maxBlock: "A whole number from 2 to 9." });
  });
});

describe("the coarse-graining search form", () => {
  it("passes steps T apart from the block size as the job's schema takes them, and leaves them out when blank (T = N)", () => {
    const withSteps = jobParams("search-projection", { rule: "90", minBlock: "2", maxBlock: "3", search: "projections", steps: "4" });
    expect(SearchProjectionParams.parse(withSteps.params)).toEqual({ rule: 90, minBlock: 2, maxBlock: 3, search: "projections", steps: 4 });
    const blank = jobParams("search-projection", { rule: "90", minBlock: "2", maxBlock: "3", search: "both", steps: " " });
    expect(blank.params).toEqual({ rule: 90, minBlock: 2, maxBlock: 3, search: "both" });
    // T = 5 > 2N at N = 2: refused here and by the job's schema alike, on the steps field
    expect(Object.keys(jobParams("search-projection", { rule: "90", minBlock: "2", maxBlock: "3", search: "both", steps: "5" }).errors)).toEqual(["steps"]);
    expect(SearchProjectionParams.safeParse({ rule: 90, minBlock: 2, maxBlock: 3, steps: 5 }).error?.issues[0].path).toEqual(["steps"]);
    expect(Object.keys(jobParams("search-projection", { rule: "90", minBlock: "2", maxBlock: "5", search: "both", steps: "3" }).errors)).toEqual(["maxBlock"]);
    expect(SearchProjectionParams.safeParse({ rule: 90, minBlock: 2, maxBlock: 5, steps: 3 }).success).toBe(false);
  });
});

describe("the large-chain lumping form", () => {
  it("gives a generated chain the job accepts", () => {
    const { params } = jobParams("lump-large-chain", { groups: "1000", members: "1000", seed: "7" });
    expect(LumpLargeChainParams.parse(params)).toEqual({ chain: { generator: "permutation-mixture", groups: 1000, members: 1000, seed: 7 } });
  });

  it("refuses more states than the job takes, on the members field, as the job's schema does", () => {
    const fields = { groups: "2000", members: "1001", seed: "1" };
    expect(jobParams("lump-large-chain", fields).errors).toHaveProperty("members");
    const asServer = LumpLargeChainParams.safeParse({ chain: { generator: "permutation-mixture", groups: 2000, members: 1001, seed: 1 } });
    expect(asServer.success).toBe(false);
    expect(asServer.error?.issues[0].path).toEqual(["chain", "members"]);
    expect(jobParams("lump-large-chain", { groups: "x", members: "3", seed: "-1" }).errors).toMatchObject({ groups: expect.any(String), seed: expect.any(String) });
  });
});

// Real certificates from the core's builders; each test checks the forms' params against the job kinds'
// own schemas and then does what the job does with them.
const rule146to128 = certifyProjection({ rule: 146, block: 3, projection: [0, 0, 0, 0, 0, 0, 0, 1] }); // Israeli & Goldenfeld, PRE 73, 026203 (2006)
const rule128to128 = certifyProjection({ rule: 128, block: 2, projection: [0, 0, 0, 1] });
// An invented weather chain: {damp, wet} is a block because both rows put 1/4 on dry (Kemeny & Snell 1960, §6.3).
const weather = { kind: "markov", labels: ["dry", "damp", "wet"], matrix: [["1/2", "1/4", "1/4"], ["1/4", "1/2", "1/4"], ["1/4", "1/4", "1/2"]] };
const weatherLump = certifyLumping({ chain: weather, partition: [0, 1, 1] });

function certificateOf(built: ReturnType<typeof certifyProjection> | ReturnType<typeof certifyLumping>): Certificate {
  if (!built.ok) throw new Error("the fixture does not hold");
  return built.certificate;
}
const picked = (id: string, from: string, to: string, certificate?: unknown): PickedMap => ({
  id,
  label: `${from} → ${to}`,
  source: { id: from, name: from.replace("e", "ECA ") },
  target: { id: to, name: to.replace("e", "ECA ") },
  certificate,
});

describe("the map check form", () => {
  it("rebuilds a chosen projection and a lumping as the job takes them, and the job's check gives the map's own certificate", () => {
    for (const cert of [certificateOf(rule146to128), certificateOf(weatherLump)]) {
      const { params, errors } = verifyMapParams(picked("m", "a", "b", cert));
      expect(errors).toEqual({});
      const parsed = VerifyMapParams.parse(params);
      const outcome = runVerifyTask({ op: "build", build: parsed.build as unknown as BuildRequest, limits: DEFAULT_LIMITS });
      expect(outcome.status).toBe("holds");
      // Same address: the job stores this very map again ("already in the atlas"), never a second one.
      expect((outcome as { address: string }).address).toBe(certificateAddress(cert));
    }
  });

  it("names the map field's fault: none chosen, still reading, unreadable, a kind the job does not take, a derived source", () => {
    expect(verifyMapParams(null)).toEqual({ params: null, errors: { map: "Choose a certified map." } });
    expect(verifyMapParams(picked("m", "a", "b")).errors.map).toBe("Reading its certificate…");
    expect(verifyMapParams({ ...picked("m", "a", "b"), readError: "The certificate could not be read (404)." }).errors.map).toBe("The certificate could not be read (404).");
    const exact = { ...certificateOf(weatherLump), map: { kind: "exact-lumping", partition: [0, 1, 1], steps: 1 } };
    expect(verifyMapParams(picked("m", "a", "b", exact)).errors.map).toBe("A map check takes projections, lumpings, decimations, blockings and iterates; this map is of kind “exact-lumping”.");
    const fromSupercell = { ...certificateOf(rule128to128), source: { kind: "supercell", base: { kind: "eca", rule: 128 }, block: 2, steps: 2 } };
    expect(verifyMapParams(picked("m", "a", "b", fromSupercell)).errors.map).toMatch(/^A map check cannot rebuild this map: its source is a derived model \(supercell\)/);
  });
});

describe("the chain check form", () => {
  const a = certificateOf(rule146to128);
  const b = certificateOf(rule128to128);

  it("sends the chosen maps' certificates in order, which the job's schema accepts and the core composes", () => {
    const { params, errors } = verifyChainParams({ name: " 146 to 128, twice ", save: true }, [picked("1", "e146", "e128", a), picked("2", "e128", "e128", b)]);
    expect(errors).toEqual({});
    const parsed = VerifyChainParams.parse(params);
    expect(parsed).toEqual({ name: "146 to 128, twice", certificates: [a, b], save: true });
    const composed = composeChain(parsed.certificates as Certificate[]);
    expect(composed.ok).toBe(true);
    // Blocking 3 then 2 is blocking 6 (FORMAT.md, pasting rule 10).
    expect(composed.ok && composed.composite.map).toMatchObject({ kind: "projection", block: 6 });
  });

  it("names the field at fault: no name, no map, links that do not meet, certificates still being read", () => {
    expect(verifyChainParams({ name: " ", save: true }, [])).toEqual({ params: null, errors: { name: "Give the chain a name.", maps: "Add at least one map." } });
    const apart = verifyChainParams({ name: "x", save: false }, [picked("2", "e128", "e128", b), picked("1", "e146", "e128", a)]);
    expect(apart.errors).toEqual({ maps: "Link 2 starts at ECA 146, but link 1 ends at ECA 128." });
    // The job's own check refuses the same order (composeChain, link 2).
    expect(composeChain([b, a]).ok).toBe(false);
    expect(verifyChainParams({ name: "x", save: true }, [picked("1", "e146", "e128")]).errors.maps).toBe("Reading the certificates…");
    const tooMany = Array.from({ length: 65 }, () => picked("2", "e128", "e128", b));
    expect(verifyChainParams({ name: "x", save: true }, tooMany).errors.maps).toBe("A chain check takes at most 64 links.");
    expect(VerifyChainParams.safeParse({ name: "x", certificates: tooMany.map((m) => m.certificate) }).success).toBe(false);
  });

  it("moves a link up or down, and leaves the order alone at either end", () => {
    expect(moveLink(["a", "b", "c"], 2, -1)).toEqual(["a", "c", "b"]);
    expect(moveLink(["a", "b", "c"], 0, 1)).toEqual(["b", "a", "c"]);
    const ends = ["a", "b"];
    expect(moveLink(ends, 0, -1)).toBe(ends);
    expect(moveLink(ends, 1, 1)).toBe(ends);
  });
});
