import { createSearchRecord } from "@/db/queries/search";
import { modelAddress } from "@/lib/models";
import { ensureModel, submitCertificate } from "@/server/atlas/submit";
import { AppError, isAppError } from "@/server/errors";
import { defineJobKind } from "./types";
import { LumpChainParams, type LumpChainOutput } from "./lump-chain.compute";

/**
 * The coarsest lumping of a (possibly large) chain: found by partition refinement in a worker,
 * submitted as a certificate when it merges states (the atlas's checker runs again within its own
 * limits), and recorded as a search of the chain.
 */
export const lumpChainKind = defineJobKind({
  name: "lump-chain",
  title: "Coarsest lumping",
  paramsSchema: LumpChainParams,
  compute: "lump-chain",
  timeoutMs: 20 * 60_000,
  computeShare: 0.7,
  isSmall: (p) => p.chain.matrix.length <= 32,
  example: {
    chain: { kind: "markov", labels: ["a", "b", "c"], matrix: [["1/2", "1/4", "1/4"], ["1/3", "1/3", "1/3"], ["1/3", "1/3", "1/3"]] },
    observable: ["a", "other", "other"],
    exact: false,
  },
  describe: (params) => {
    const p = LumpChainParams.safeParse(params);
    return p.success ? `${p.data.chain.matrix.length}-state chain, observable with ${new Set(p.data.observable).size} values` : "";
  },
  async persist({ job, params, output, onProgress }) {
    const result = output as LumpChainOutput;
    if (!result.ok) throw new AppError("bad_input", result.reason, { field: result.field });
    if (!job.ownerId) throw new AppError("conflict", "The job's owner has left; nothing was saved.");
    const summary = { states: result.states, blocks: result.blocks, partition: result.partition };
    let stored: { status: string; mapId: string; address: string } | { refused: string } | null = null;
    if (result.certificate) {
      onProgress(0.1, "submitting the lumping");
      try {
        stored = await submitCertificate({ workspaceId: job.workspaceId, userId: job.ownerId, certificate: result.certificate });
      } catch (err) {
        if (!isAppError(err)) throw err;
        stored = { refused: err.message };
      }
    }
    onProgress(0.6, "recording the search");
    try {
      const { model } = await ensureModel({ workspaceId: job.workspaceId, userId: job.ownerId, model: params.chain });
      await createSearchRecord({
        workspaceId: job.workspaceId,
        modelId: model.id,
        kind: params.exact ? "coarsest-exact-lumping" : "coarsest-lumping",
        maxBlock: null,
        algorithm: result.coverage.algorithm,
        algorithmVersion: result.coverage.version,
        // Only lumpings that refine the observable were searched, so this rules out no other target.
        coverage: { states: result.states, observable: params.observable, targetKinds: [], exhaustive: true },
        outcome: { targets: result.certificate ? [modelAddress(result.certificate.target)] : [], blocks: result.blocks, partition: result.partition },
        jobId: job.id,
        userId: job.ownerId,
      });
    } catch (err) {
      if (!isAppError(err)) throw err;
      return { ...summary, certificate: stored, searchRecord: `not stored: ${err.message}` };
    }
    onProgress(1, "saved");
    return { ...summary, certificate: stored, searchRecord: "stored" };
  },
});
