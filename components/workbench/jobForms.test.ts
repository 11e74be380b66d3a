import { describe, expect, it } from "vitest";
import { LumpLargeChainParams } from "@/server/jobs/kinds/lump-large-chain.compute";
import { TotalisticAtlasParams } from "@/server/jobs/kinds/totalistic-atlas.compute";
import { TOTALISTIC_CODES } from "@/lib/discovery/totalisticAtlas";
import { DEFAULT_FIELDS, jobParams } from "./jobForms";

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
