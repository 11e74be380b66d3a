// Runs in a job worker thread: lib/ only.
import { createHash } from "node:crypto";
import { z } from "zod";
import { coarsestLumping, permutationMixture, type Coverage } from "@/lib/discovery";
import { checkExactLumpingSparse } from "@/lib/markov";
import { formatRational } from "@/lib/rational";
import type { ComputeContext } from "./types";

/** Largest generated chain the job builds (states), and the largest partition and lumped chain it returns in full. */
export const MAX_LARGE_CHAIN_STATES = 2_000_000;
export const MAX_LISTED_STATES = 10_000;
export const MAX_LISTED_BLOCKS = 2_000;

export const LumpLargeChainParams = z.strictObject({
  chain: z
    .strictObject({
      generator: z.literal("permutation-mixture").meta({ description: "Ten permutations mixed with weights k/55 (lib/discovery/markov/permutationMixture.ts)." }),
      groups: z.number().int().min(1).max(MAX_LARGE_CHAIN_STATES),
      members: z.number().int().min(1).max(MAX_LARGE_CHAIN_STATES),
      seed: z.number().int().min(0).max(2 ** 31),
    })
    .refine((c) => c.groups * c.members <= MAX_LARGE_CHAIN_STATES, { path: ["members"], message: `groups × members must be at most ${MAX_LARGE_CHAIN_STATES.toLocaleString("en")} states` })
    .meta({ description: "A generated chain: groups × members states, ten transitions out of each." }),
});
export type LumpLargeChainParams = z.infer<typeof LumpLargeChainParams>;

export type LumpLargeChainOutput = {
  stopped: "cancelled" | "deadline" | null;
  states: number;
  transitions: number;
  blocks: number;
  /** sha256 of the canonical partition written as comma-separated block numbers */
  partitionDigest: string;
  /** the partition itself when the chain has at most MAX_LISTED_STATES states */
  partition: number[] | null;
  blockSizes: { size: number; blocks: number }[];
  /** the core's sparse exact-lumping checker on the found partition */
  check: { status: "holds" } | { status: "fails"; counterexample: unknown } | null;
  /** the lumped chain Q[I][J] (non-zero entries) when there are at most MAX_LISTED_BLOCKS blocks */
  lumped: { from: number; to: number; value: string }[] | null;
  coverage: Coverage;
};

/** Sizes of the blocks, tallied: how many blocks have each size. */
function blockSizes(partition: number[], blocks: number): { size: number; blocks: number }[] {
  const size = new Int32Array(blocks);
  for (const b of partition) size[b]++;
  const tally = new Map<number, number>();
  for (const s of size) tally.set(s, (tally.get(s) ?? 0) + 1);
  return [...tally].sort((a, b) => a[0] - b[0]).map(([s, count]) => ({ size: s, blocks: count }));
}

/** The coarsest exact lumping of a generated chain, checked by the core's sparse checker before it is returned. */
export function compute(params: LumpLargeChainParams, context: ComputeContext): LumpLargeChainOutput {
  const { groups, members } = params.chain;
  context.onProgress(0, `building ${(groups * members).toLocaleString("en")} states`);
  const chain = permutationMixture(params.chain);
  context.onProgress(0.2, "refining the partition");
  const found = coarsestLumping({ chain, labels: new Array<number>(chain.size).fill(0), exact: true, signal: context.signal });
  const digest = `sha256:${createHash("sha256").update(found.partition.join(",")).digest("hex")}`;
  const base = {
    stopped: found.stopped,
    states: chain.size,
    transitions: chain.col.length,
    blocks: found.blocks,
    partitionDigest: digest,
    partition: chain.size <= MAX_LISTED_STATES ? found.partition : null,
    blockSizes: blockSizes(found.partition, found.blocks),
    coverage: found.coverage,
  };
  if (found.stopped) return { ...base, check: null, lumped: null };
  context.onProgress(0.7, `checking ${found.blocks} blocks`);
  const check = checkExactLumpingSparse(chain, found.partition, { lumped: found.blocks <= MAX_LISTED_BLOCKS });
  context.onProgress(1, "checked");
  if (!check.ok) return { ...base, check: { status: "fails", counterexample: check.counterexample }, lumped: null };
  const lumped = found.blocks <= MAX_LISTED_BLOCKS ? check.lumped.map((e) => ({ from: e.from, to: e.to, value: formatRational(e.value) })) : null;
  return { ...base, check: { status: "holds" }, lumped };
}
