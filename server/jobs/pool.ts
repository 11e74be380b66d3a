import { MessageChannel } from "node:worker_threads";
import path from "node:path";
import Tinypool from "tinypool";

/** The worker entry; resolved from the project root so that it is found the same way in every runner. */
export const WORKER_FILE = path.join(process.cwd(), "server/jobs/worker.mjs");

export type PoolOptions = {
  /** Worker threads at most. */
  workers: number;
  /** V8 old-generation bound per worker thread, in MB (the per-job memory bound). @default 512 */
  memoryMb?: number;
};

export type TaskInput = {
  /** Key of the compute step in the worker's static table (kinds/computes.ts). */
  compute: string;
  /** File URL of another table exporting COMPUTES (the job tests' own kinds). @default the product's */
  computes?: string;
  params: unknown;
  timeoutMs: number;
  onProgress: (fraction: number, item: string | null) => void;
  /** Aborting asks the computation to stop (cooperatively); after `graceMs` the thread is terminated. */
  cancel: AbortSignal;
  /** @default 3000 */
  graceMs?: number;
};

export type TaskOutcome =
  | { status: "done"; output: unknown }
  | { status: "cancelled"; output: unknown }
  | { status: "timeout"; timeoutMs: number }
  | { status: "error"; message: string };

export type WorkerPool = {
  run(input: TaskInput): Promise<TaskOutcome>;
  destroy(): Promise<void>;
};

/**
 * A tinypool of worker threads, one job per thread at a time. The time bound terminates the thread
 * (tinypool's abort of a running task); the memory bound is V8's resourceLimits, which ends the
 * thread with ERR_WORKER_OUT_OF_MEMORY. A terminated thread is replaced by the pool.
 */
export function createWorkerPool(options: PoolOptions): WorkerPool {
  const memoryMb = options.memoryMb ?? 512;
  const pool = new Tinypool({
    filename: WORKER_FILE,
    minThreads: 0,
    maxThreads: Math.max(1, options.workers),
    idleTimeout: 60_000,
    resourceLimits: { maxOldGenerationSizeMb: memoryMb },
  });

  async function run(input: TaskInput): Promise<TaskOutcome> {
    const cancelFlag = new SharedArrayBuffer(4);
    const flag = new Int32Array(cancelFlag);
    const { port1, port2 } = new MessageChannel();
    const terminate = new AbortController();
    let timedOut = false;
    let cancelled = false;
    port1.on("message", (m: { fraction: number; item: string | null }) => input.onProgress(m.fraction, m.item));

    const timer = setTimeout(() => {
      timedOut = true;
      terminate.abort();
    }, input.timeoutMs);
    let graceTimer: NodeJS.Timeout | undefined;
    const onCancel = () => {
      cancelled = true;
      Atomics.store(flag, 0, 1);
      graceTimer = setTimeout(() => terminate.abort(), input.graceMs ?? 3000);
    };
    if (input.cancel.aborted) onCancel();
    else input.cancel.addEventListener("abort", onCancel, { once: true });

    try {
      const reply = (await pool.run(
        { compute: input.compute, computes: input.computes, params: input.params, cancelFlag, port: port2 },
        { transferList: [port2], signal: terminate.signal },
      )) as { output: unknown; cancelled: boolean };
      if (reply.cancelled || cancelled) return { status: "cancelled", output: reply.output };
      return { status: "done", output: reply.output };
    } catch (err) {
      if (timedOut) return { status: "timeout", timeoutMs: input.timeoutMs };
      if (cancelled) return { status: "cancelled", output: null };
      return { status: "error", message: describeWorkerError(err, memoryMb) };
    } finally {
      clearTimeout(timer);
      clearTimeout(graceTimer);
      input.cancel.removeEventListener("abort", onCancel);
      port1.close();
    }
  }

  return { run, destroy: () => pool.destroy() };
}

function describeWorkerError(err: unknown, memoryMb: number): string {
  const code = (err as { code?: string } | null)?.code;
  if (code === "ERR_WORKER_OUT_OF_MEMORY") return `the job exceeded its memory bound of ${memoryMb} MB`;
  if (err instanceof Error) return err.message;
  return String(err);
}
