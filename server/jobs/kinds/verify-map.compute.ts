// Runs in a job worker thread: lib/ and the verifier's task (itself lib/ only).
import { z } from "zod";
import { runVerifyTask, type BuildRequest, type VerifyOutcome } from "@/server/atlas/verify-task";
import { JOB_LIMITS } from "./verify-chain.compute";
import type { ComputeContext } from "./types";

export const VerifyMapParams = z.strictObject({
  build: z.looseObject({ kind: z.enum(["projection", "lumping", "decimation", "blocking", "iterate"]) }).meta({
    description: "A claim as POST /api/certificates takes it in `build`: the server builds the certificate and checks it.",
  }),
});
export type VerifyMapParams = z.infer<typeof VerifyMapParams>;

/** The builder and the checker, with the job's bounds (16 times a request's windows). */
export function compute(params: VerifyMapParams, context: ComputeContext): VerifyOutcome {
  context.onProgress(0, `checking a ${params.build.kind}`);
  const outcome = runVerifyTask({ op: "build", build: params.build as unknown as BuildRequest, limits: JOB_LIMITS });
  context.onProgress(1, "checked");
  return outcome;
}
