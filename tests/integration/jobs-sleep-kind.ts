// A job kind for the job-system tests only (registered by the tests, never by the product): counts
// to `steps`, busy-waiting `stepMs` per step so that the worker thread never yields to its event
// loop — the case that cooperative cancellation through shared memory has to handle.
import { appendFileSync } from "node:fs";
import { z } from "zod";

export const SleepAndCountParams = z.object({
  steps: z.number().int().min(1).max(10_000),
  stepMs: z.number().int().min(0).max(1000),
  /** Keep counting after a cancel request (forces the runner to terminate the thread). */
  ignoreCancel: z.boolean().default(false),
  /** Allocate this many MB per step and keep them (to hit the memory bound). */
  allocateMb: z.number().int().min(0).max(64).default(0),
  failAt: z.number().int().min(0).optional(),
  /** Append `mark` and a newline to this file when the computation starts (the cluster tests count runs). */
  runLog: z.string().optional(),
  mark: z.string().optional(),
});
export type SleepAndCountParams = z.infer<typeof SleepAndCountParams>;

export function compute(params: SleepAndCountParams, context: { onProgress: (f: number, item: string) => void; signal: AbortSignal }) {
  // One short write with O_APPEND: lines from several processes do not interleave.
  if (params.runLog) appendFileSync(params.runLog, `${params.mark ?? ""}\n`);
  const kept: number[][] = [];
  let counted = 0;
  for (let i = 0; i < params.steps; i++) {
    context.onProgress(i / params.steps, `step ${i + 1} of ${params.steps}`);
    if (context.signal.aborted && !params.ignoreCancel) return { stopped: "cancelled", counted };
    if (params.failAt === i) throw new Error(`asked to fail at step ${i}`);
    // A plain array of doubles lives on the V8 heap (a typed array's buffer would not count).
    if (params.allocateMb > 0) kept.push(Array.from({ length: params.allocateMb * 131_072 }, (_, j) => i + j + 0.5));
    const until = Date.now() + params.stepMs;
    while (Date.now() < until) {
      // busy wait: the event loop of the worker is blocked on purpose
    }
    counted++;
  }
  return { stopped: null, counted, kept: kept.length };
}
