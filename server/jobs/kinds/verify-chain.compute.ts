// Runs in a job worker thread: lib/ only.
import { z } from "zod";
import { certificateSummary, certificateText, type Certificate, type Counterexample } from "@/lib/certificate";
import { composeChain } from "@/lib/chain";
import { CHECKER_VERSION, DEFAULT_LIMITS, type Limits } from "@/lib/verify";
import type { ComputeContext } from "./types";

export const VerifyChainParams = z.strictObject({
  name: z.string().trim().min(1).max(200).meta({ description: "A name for the chain, when it is saved." }),
  certificates: z.array(z.unknown()).min(1).max(64).meta({ description: "The links, in order: certificates whose targets meet the next sources." }),
  /** Store the links and the chain in the atlas when the check succeeds. @default true */
  save: z.boolean().default(true),
});
export type VerifyChainParams = z.infer<typeof VerifyChainParams>;

/**
 * A job may check what a request may not: the composite's own exhaustive check runs here with
 * bounds 16 times the request's (the job's time and memory bounds still apply).
 */
export const JOB_LIMITS: Limits = {
  ...DEFAULT_LIMITS,
  maxWindows: DEFAULT_LIMITS.maxWindows * 16,
  maxCaCost: (DEFAULT_LIMITS.maxCaCost ?? 2 ** 30) * 16,
  maxStates: DEFAULT_LIMITS.maxStates * 2,
};

export type VerifyChainOutput =
  | {
      ok: true;
      verification: "links" | "links+composite";
      checkerVersion: string;
      composite: Certificate;
      compositeText: string;
      links: Certificate[];
      summary: string;
    }
  | { ok: false; link: number; reason: string; counterexample?: Counterexample };

export function compute(params: VerifyChainParams, context: ComputeContext): VerifyChainOutput {
  context.onProgress(0, `checking ${params.certificates.length} links and their composite`);
  const result = composeChain(params.certificates as Certificate[], JOB_LIMITS);
  if (!result.ok) return result;
  context.onProgress(1, "checked");
  return {
    ok: true,
    verification: result.verification,
    checkerVersion: CHECKER_VERSION,
    composite: result.composite,
    compositeText: certificateText(result.composite),
    links: params.certificates as Certificate[],
    summary: certificateSummary(result.composite).text,
  };
}
