import { defineJobKind } from "./types";
import { SearchProjectionParams, type SearchProjectionOutput } from "./search-projection.compute";
import { storeCaFindings } from "./findings";

/** One ECA searched further than the atlas goes: every coarse-graining found submitted, and the search recorded. */
export const searchProjectionKind = defineJobKind({
  name: "search-projection",
  title: "Coarse-graining search",
  paramsSchema: SearchProjectionParams,
  compute: "search-projection",
  timeoutMs: 20 * 60_000,
  computeShare: 0.8,
  // Work grows as 8^block: up to block 3 a search takes seconds.
  isSmall: (p) => p.maxBlock <= 3,
  example: { rule: 110, minBlock: 2, maxBlock: 4, search: "both" },
  describe: (params) => {
    const p = SearchProjectionParams.safeParse(params);
    return p.success ? `rule ${p.data.rule}, ${p.data.search}, block ${p.data.minBlock}–${p.data.maxBlock}${p.data.steps !== undefined ? `, ${p.data.steps} steps` : ""}` : "";
  },
  async persist({ job, output, onProgress, signal }) {
    const result = output as SearchProjectionOutput;
    const saved = await storeCaFindings({ job, findings: result, onProgress, signal });
    return { coverage: result.coverage, found: result.findings.length, ...saved };
  },
});
