import "server-only";
import path from "node:path";
import Tinypool from "tinypool";
import { env } from "@/env";
import { DEFAULT_LIMITS, type Limits } from "@/lib/verify";
import { AppError } from "@/server/errors";
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

const holder = globalThis as unknown as { squarelyVerifyPool?: Tinypool };

function pool(): Tinypool {
  holder.squarelyVerifyPool ??= new Tinypool({
    filename: VERIFY_WORKER_FILE,
    minThreads: 0,
    maxThreads: 2,
    idleTimeout: 300_000, // a thread that has loaded the checker stays warm for the next submission
    resourceLimits: { maxOldGenerationSizeMb: VERIFY_LIMITS.memoryMb },
  });
  return holder.squarelyVerifyPool;
}

type TaskWithoutLimits = VerifyTask extends infer T ? (T extends { limits: Limits } ? Omit<T, "limits"> : T) : never;

/**
 * Runs a check in a worker thread within the configured bounds. Exceeding the time or memory
 * bound terminates the thread and answers 413, like a check refused by the size limits.
 */
export async function runVerification(task: TaskWithoutLimits, bounds = VERIFY_LIMITS): Promise<VerifyOutcome> {
  const full = (task.op === "model" ? task : { ...task, limits: bounds.sizes }) as VerifyTask;
  const abort = new AbortController();
  let timedOut = false;
  const timer = setTimeout(() => {
    timedOut = true;
    abort.abort();
  }, bounds.timeoutMs);
  try {
    return (await pool().run({ taskModule: VERIFY_TASK_FILE, task: full }, { signal: abort.signal })) as VerifyOutcome;
  } catch (err) {
    if (timedOut) {
      throw new AppError("too_large", `The check did not finish within ${bounds.timeoutMs} ms.`, {
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
  const p = holder.squarelyVerifyPool;
  holder.squarelyVerifyPool = undefined;
  await p?.destroy();
}
