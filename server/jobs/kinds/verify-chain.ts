import { createChain } from "@/db/queries/chains";
import { CERTIFICATE_VERSION } from "@/lib/certificate";
import { submitCertificate } from "@/server/atlas/submit";
import { AppError } from "@/server/errors";
import { defineJobKind } from "./types";
import { VerifyChainParams, type VerifyChainOutput } from "./verify-chain.compute";

/**
 * A chain too large to check inside a request: the links and the composite are checked in a job
 * worker (with the job's larger bounds); when asked, each link is then submitted as a certificate
 * (re-verified by the atlas's own checker) and the chain is stored with the composite this job
 * verified.
 */
export const verifyChainKind = defineJobKind({
  name: "verify-chain",
  title: "Chain check",
  paramsSchema: VerifyChainParams,
  compute: "verify-chain",
  timeoutMs: 10 * 60_000,
  computeShare: 0.7,
  isSmall: (p) => p.certificates.length <= 4,
  example: { name: "my chain", certificates: [], save: true },
  describe: (params) => {
    const p = VerifyChainParams.safeParse(params);
    return p.success ? `"${p.data.name}", ${p.data.certificates.length} links` : "";
  },
  async persist({ job, params, output, onProgress, signal }) {
    const result = output as VerifyChainOutput;
    if (!result.ok) throw new AppError("does_not_commute", result.reason, { details: { link: result.link, counterexample: result.counterexample } });
    const summary = { ok: true, verification: result.verification, composite: result.composite.address, summary: result.summary };
    if (!params.save) return summary;
    if (!job.ownerId) throw new AppError("conflict", "The job's owner has left; nothing was saved.");
    const mapIds: string[] = [];
    for (const [i, certificate] of result.links.entries()) {
      if (signal.aborted) return { ...summary, saved: false, mapIds };
      const stored = await submitCertificate({ workspaceId: job.workspaceId, userId: job.ownerId, certificate });
      mapIds.push(stored.mapId);
      onProgress((i + 1) / (result.links.length + 1), `stored link ${i + 1} of ${result.links.length}`);
    }
    const chain = await createChain({
      workspaceId: job.workspaceId,
      userId: job.ownerId,
      name: params.name,
      mapIds,
      verification: result.verification,
      composite: {
        address: result.composite.address as string,
        kind: result.composite.map.kind,
        formatVersion: CERTIFICATE_VERSION,
        body: result.compositeText,
        checkerVersion: result.checkerVersion,
        verifiedAt: new Date(),
      },
    });
    onProgress(1, "stored the chain");
    return { ...summary, saved: true, mapIds, chainId: chain.chainId };
  },
});
