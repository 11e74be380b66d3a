import { defineJobKind } from "./types";
import { EcaAtlasParams, type EcaAtlasOutput } from "./eca-atlas.compute";
import { storeCaFindings } from "./findings";

/**
 * The ECA atlas: binary projections and/or congruences of all 256 elementary CAs over a range of
 * block sizes, every coarse-graining found submitted as a certificate and one search record per
 * rule and search kind.
 */
export const ecaAtlasKind = defineJobKind({
  name: "eca-atlas",
  title: "ECA atlas",
  paramsSchema: EcaAtlasParams,
  compute: "eca-atlas",
  timeoutMs: 30 * 60_000,
  computeShare: 0.3,
  example: { minBlock: 2, maxBlock: 3, search: "projections" },
  describe: (params) => {
    const p = EcaAtlasParams.safeParse(params);
    return p.success ? `all 256 rules, ${p.data.search}, block ${p.data.minBlock}–${p.data.maxBlock}` : "";
  },
  async persist({ job, output, onProgress, signal }) {
    const result = output as EcaAtlasOutput;
    const saved = await storeCaFindings({ job, findings: result, onProgress, signal });
    return { coverage: result.coverage, found: result.findings.length, ...saved };
  },
});
