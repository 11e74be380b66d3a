// Runs in a job worker thread: lib/ only.
import { z } from "zod";
import { certifyExactLumping, certifyLumping, type Certificate } from "@/lib/certificate";
import { coarsestLumping, type Coverage } from "@/lib/discovery";
import { canonicalModel, modelAddress, modelMatrix } from "@/lib/models";
import type { ComputeContext } from "./types";

export const LumpChainParams = z.strictObject({
  chain: z
    .strictObject({
      kind: z.literal("markov"),
      labels: z.array(z.string().min(1).max(200)).max(5000).optional(),
      matrix: z.array(z.array(z.string().min(1).max(200)).max(5000)).min(1).max(5000),
    })
    .meta({ description: "The chain: one row per state, exact rationals as strings (\"1/3\", \"0.25\")." }),
  observable: z
    .array(z.union([z.string().max(200), z.number().int()]))
    .min(1)
    .max(5000)
    .meta({ description: "One value per state; states with different values are never merged (the lumping refines this partition)." }),
  exact: z.boolean().default(false).meta({ description: "Exact lumpability (equal column sums into each block; Buchholz 1994) instead of strong lumpability." }),
}).refine((p) => p.observable.length === p.chain.matrix.length, { path: ["observable"], message: "give one observable value per state of the chain" });
export type LumpChainParams = z.infer<typeof LumpChainParams>;

export type LumpChainOutput =
  | { ok: false; reason: string; field: string }
  | {
      ok: true;
      stopped: "cancelled" | "deadline" | null;
      states: number;
      blocks: number;
      partition: number[];
      certificate: Certificate | null;
      chainAddress: string;
      coverage: Coverage;
    };

/** The coarsest strong (or exact) lumping that keeps the observable's classes apart, certified when it merges any states. */
export function compute(params: LumpChainParams, context: ComputeContext): LumpChainOutput {
  let model;
  try {
    model = canonicalModel(params.chain);
  } catch (err) {
    return { ok: false, reason: err instanceof Error ? err.message : String(err), field: "params.chain" };
  }
  const states = params.chain.matrix.length;
  if (params.observable.length !== states) {
    return { ok: false, reason: `the observable has ${params.observable.length} values for a ${states}-state chain`, field: "params.observable" };
  }
  const found = coarsestLumping({ chain: modelMatrix(model), labels: params.observable, exact: params.exact, signal: context.signal, onProgress: context.onProgress });
  const base = { ok: true as const, stopped: found.stopped, states, blocks: found.blocks, partition: found.partition, chainAddress: modelAddress(model), coverage: found.coverage };
  if (found.stopped || found.blocks === states) return { ...base, certificate: null };
  context.onProgress(0.95, `certifying ${found.blocks} blocks`);
  const built = (params.exact ? certifyExactLumping : certifyLumping)({ chain: model, partition: found.partition });
  if (!built.ok) return { ok: false, reason: "the checker refused the lumping the search found", field: "params.chain" };
  return { ...base, certificate: built.certificate };
}
