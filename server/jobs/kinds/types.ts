import type { z } from "zod";
import type { Database } from "@/db/client";
import type { Job } from "@/db/schema";

/** What a compute module receives inside the worker thread. */
export type ComputeContext = {
  onProgress: (fraction: number, item: string) => void;
  signal: AbortSignal;
};

export type PersistInput<P> = {
  db: Database;
  job: Job;
  params: P;
  /** What `compute` returned in the worker. */
  output: unknown;
  onProgress: (fraction: number, item: string) => void;
  signal: AbortSignal;
};

/**
 * A kind of job. The heavy part (the `compute` function registered in computes.ts) runs in a worker thread and may use
 * lib/ only; `persist` runs afterwards in the app process and writes what was found (certificates
 * through the atlas's submit path, search records). What `persist` returns (or, without it, what
 * `compute` returned) is stored as the job's result.
 */
export type JobKind<P = unknown> = {
  name: string;
  /** A short human title for lists ("ECA atlas", "Coarsest lumping"). */
  title: string;
  paramsSchema: z.ZodType<P>;
  /**
   * The key of its `compute(params: P, context: ComputeContext)` in the worker's static table
   * (computes.ts; the job tests bring a table of their own).
   */
  compute: string;
  /** The time bound of the compute step. */
  timeoutMs: number;
  /** Share of the progress bar given to compute when a persist step follows. @default 0.5 */
  computeShare?: number;
  persist?: (input: PersistInput<P>) => Promise<unknown>;
  /** One line for the jobs list, from the params ("rule 110, blocks 2–3"). Gets stored params, so it checks them. */
  describe?: (params: unknown) => string;
  /**
   * Whether a job with these (validated) params is small: expected to finish within seconds. Small
   * jobs have a worker that large ones may not take (server/jobs/fairness.ts). @default never small
   */
  isSmall?: (params: P) => boolean;
  /** Parameters that the "start a job" form offers first. */
  example?: P;
};

/** Forgets the parameter type, for the registry. */
export function defineJobKind<P>(kind: JobKind<P>): JobKind<unknown> {
  return kind as unknown as JobKind<unknown>;
}
