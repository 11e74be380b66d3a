import { AppError } from "@/server/errors";
import { defineJobKind } from "./types";
import { LumpLargeChainParams, type LumpLargeChainOutput } from "./lump-large-chain.compute";

/**
 * The coarsest exact lumping (Buchholz 1994) of a generated chain of up to two million states: splitter refinement
 * on the transposed chain in a worker, then the core's sparse checker on the partition found. Such a chain is too
 * large for a dense certificate, so the job's stored result carries the checker's verdict, the partition's digest
 * and, when small enough, the partition and the lumped chain. (Chains already in the atlas are dense and small: the
 * lump-chain kind with exact: true certifies them as maps.)
 */
export const lumpLargeChainKind = defineJobKind({
  name: "lump-large-chain",
  title: "Coarsest exact lumping of a large chain",
  paramsSchema: LumpLargeChainParams,
  compute: "lump-large-chain",
  timeoutMs: 20 * 60_000,
  computeShare: 0.95,
  isSmall: (p) => p.chain.groups * p.chain.members <= 10_000,
  example: { chain: { generator: "permutation-mixture", groups: 1000, members: 1000, seed: 11 } },
  describe: (params) => {
    const p = LumpLargeChainParams.safeParse(params);
    return p.success ? `permutation mixture, ${(p.data.chain.groups * p.data.chain.members).toLocaleString("en")} states` : "";
  },
  async persist({ output, onProgress }) {
    const result = output as LumpLargeChainOutput;
    // nothing unchecked is stored: a partition the checker refuses fails the job
    if (!result.stopped && result.check?.status !== "holds") throw new AppError("conflict", "The checker refused the lumping the search found; nothing was saved.");
    onProgress(1, "saved");
    return result;
  },
});
