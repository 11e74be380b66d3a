import "server-only";
import path from "node:path";
import Tinypool from "tinypool";
import { env } from "@/env";
import { DEFAULT_LIMITS, type Limits } from "@/lib/verify";
import { AppError } from "@/server/errors";
import { FairQueue, type Lane, type Owner } from "./fair-queue";
import type { VerifyOutcome, VerifyTask } from "./verify-task";

/** Resolved from the project root so that they are found the same way under next start, vitest and tsx. */
export const VERIFY_WORKER_FILE = path.join(process.cwd(), "server/atlas/verify-worker.mjs");
export const VERIFY_TASK_FILE = path.join(process.cwd(), "server/atlas/verify-task.ts");

/** The configured bounds of one server-side check: the core's size limits, a time and a memory bound. */
export const VERIFY_LIMITS: { sizes: Limits; timeoutMs: number; memoryMb: number } = {
  sizes: DEFAULT_LIMITS,
  timeoutMs: env.VERIFY_TIMEOUT_MS,
  memoryMb: env.VERIFY_MEMORY_MB,
};

/**
 * Threads per lane: two for any check, and one more that only small checks use, so that a model
 * or a small square is never stuck behind two long checks. Checks one person may have waiting.
 */
export const VERIFY_SLOTS: Record<Lane, number> = { main: 2, fast: 1 };
export const MAX_WAITING_PER_PERSON = 8;

type Pools = { main: Tinypool; fast: Tinypool; queue: FairQueue };
const holder = globalThis as unknown as { squarelyVerifyPools?: Pools };

function newPool(threads: number): Tinypool {
  return new Tinypool({
    filename: VERIFY_WORKER_FILE,
    minThreads: 0,
    maxThreads: threads,
    idleTimeout: 300_000, // a thread that has loaded the checker stays warm for the next submission
    resourceLimits: { maxOldGenerationSizeMb: VERIFY_LIMITS.memoryMb },
  });
}

function pools(): Pools {
  holder.squarelyVerifyPools ??= {
    main: newPool(VERIFY_SLOTS.main),
    fast: newPool(VERIFY_SLOTS.fast),
    queue: new FairQueue({
      slots: VERIFY_SLOTS,
      maxWaitingPerPerson: MAX_WAITING_PER_PERSON,
      onFull: (_owner, waiting) =>
        new AppError("too_many_requests", `You have ${waiting} checks waiting for the verifier; wait for them to finish.`, {
          details: { bound: "waiting checks", limit: MAX_WAITING_PER_PERSON },
        }),
    }),
  };
  return holder.squarelyVerifyPools;
}

type TaskWithoutLimits = VerifyTask extends infer T ? (T extends { limits: Limits } ? Omit<T, "limits"> : T) : never;

/** Whose check it is and whether it may take the fast lane; checks without an owner share one. */
export type CheckOwner = Owner & { small?: boolean };
const NOBODY: CheckOwner = { workspaceId: "", userId: "", small: false };

/**
 * Runs a check in a worker thread within the configured bounds, after waiting its fair turn (see
 * FairQueue). The time bound starts when the check gets its thread, not while it waits. Exceeding
 * the time or memory bound terminates the thread and answers 413, like a check refused by the
 * size limits.
 */
export async function runVerification(task: TaskWithoutLimits, bounds = VERIFY_LIMITS, owner: CheckOwner = NOBODY): Promise<VerifyOutcome> {
  const full = { ...task, limits: bounds.sizes } as VerifyTask;
  const { queue, main, fast } = pools();
  return queue.submit({
    workspaceId: owner.workspaceId,
    userId: owner.userId,
    small: owner.small ?? false,
    run: (lane) => runTimed(lane === "fast" ? fast : main, full, bounds),
  });
}

async function runTimed(pool: Tinypool, task: VerifyTask, bounds: typeof VERIFY_LIMITS): Promise<VerifyOutcome> {
  const abort = new AbortController();
  let timedOut = false;
  const timer = setTimeout(() => {
    timedOut = true;
    abort.abort();
  }, bounds.timeoutMs);
  try {
    return (await pool.run({ taskModule: VERIFY_TASK_FILE, task }, { signal: abort.signal })) as VerifyOutcome;
  } catch (err) {
    if (timedOut) {
      throw new AppError("too_large", `The check did not finish within ${bounds.timeoutMs} ms of work.`, {
        details: { bound: "time", limit: bounds.timeoutMs },
      });
    }
    if ((err as { code?: string } | null)?.code === "ERR_WORKER_OUT_OF_MEMORY") {
      throw new AppError("too_large", `The check needed more than ${bounds.memoryMb} MB.`, {
        details: { bound: "memory", limit: bounds.memoryMb },
      });
    }
    throw new AppError("internal", "The verification worker failed; nothing was written.", { cause: err });
  } finally {
    clearTimeout(timer);
  }
}

/** Stops the worker threads (tests, and a clean shutdown). */
export async function closeVerificationPool(): Promise<void> {
  const p = holder.squarelyVerifyPools;
  holder.squarelyVerifyPools = undefined;
  await Promise.all([p?.main.destroy(), p?.fast.destroy()]);
}

/** Checks waiting and running per lane (an operator's view, and tests). */
export function verificationLoad(): { waiting: number; running: Record<Lane, number> } {
  return pools().queue.snapshot();
}
