import type { Database } from "@/db/client";
import type { Job } from "@/db/schema";
import {
  claimJob,
  finishJob,
  listCancelRequested,
  listQueuedJobs,
  recoverInterruptedJobs,
  updateJobProgress,
} from "@/db/queries/jobs";
import { isAppError } from "@/server/errors";
import { getJobKind } from "./kinds/registry";
import type { JobKind } from "./kinds/types";
import { createWorkerPool, type TaskOutcome, type WorkerPool } from "./pool";
import { onWakeJobRunner } from "./wake";

/** A job interrupted by a restart runs once more; interrupted again, it fails with a reason. */
export const MAX_JOB_ATTEMPTS = 2;
const PROGRESS_WRITE_MS = 250;

export type JobRunnerOptions = {
  db: Database;
  workers: number;
  /** Per-job memory bound in MB. @default 512 */
  memoryMb?: number;
  /** How often the runner looks for queued jobs and cancel requests. @default 1000 */
  pollMs?: number;
  /** Time given to a cancelled computation to stop by itself before its thread is terminated. @default 3000 */
  graceMs?: number;
  /** File URL of a COMPUTES table other than the product's (tests register kinds of their own). */
  computes?: string;
};

export type JobRunner = {
  /** Recovers interrupted jobs, then polls. */
  start(): Promise<void>;
  /** Starts what fits now and forwards cancel requests; resolves when the claims are made. */
  tick(): Promise<void>;
  /** Runs until no job is queued or running (the seed and tests use this). */
  drain(): Promise<void>;
  recover(): ReturnType<typeof recoverInterruptedJobs>;
  /** Stops polling, waits for running jobs, and ends the worker threads. */
  stop(): Promise<void>;
  runningCount(): number;
};

type Running = { job: Job; cancel: AbortController; done: Promise<void> };

export function createJobRunner(options: JobRunnerOptions): JobRunner {
  const { db } = options;
  const workers = Math.max(1, options.workers);
  const pool: WorkerPool = createWorkerPool({ workers, memoryMb: options.memoryMb });
  const running = new Map<string, Running>();
  let timer: NodeJS.Timeout | undefined;
  let unsubscribe: (() => void) | undefined;
  let ticking: Promise<void> | null = null;
  let stopped = false;

  function tick(): Promise<void> {
    if (stopped) return Promise.resolve();
    ticking ??= tickOnce().finally(() => {
      ticking = null;
    });
    return ticking;
  }

  async function tickOnce(): Promise<void> {
    const cancelled = await listCancelRequested({ db, ids: [...running.keys()] });
    for (const id of cancelled) running.get(id)?.cancel.abort();
    const free = workers - running.size;
    if (free <= 0) return;
    for (const candidate of await listQueuedJobs({ db, limit: free })) {
      const job = await claimJob({ db, id: candidate.id });
      if (!job) continue;
      const entry: Running = { job, cancel: new AbortController(), done: Promise.resolve() };
      entry.done = execute(entry).finally(() => {
        running.delete(job.id);
        void tick();
      });
      running.set(job.id, entry);
    }
  }

  async function execute(entry: Running): Promise<void> {
    const { job } = entry;
    try {
      const kind = getJobKind(job.kind);
      if (!kind) {
        await finishJob({ db, id: job.id, status: "failed", error: `unknown job kind "${job.kind}"` });
        return;
      }
      const parsed = kind.paramsSchema.safeParse(JSON.parse(job.params));
      if (!parsed.success) {
        await finishJob({ db, id: job.id, status: "failed", error: `invalid parameters: ${parsed.error.issues[0].message}` });
        return;
      }
      await runKind(entry, kind, parsed.data);
    } catch (err) {
      if (!isAppError(err)) console.error(`job ${job.id} (${job.kind}) failed:`, err);
      await finishJob({ db, id: job.id, status: "failed", error: publicMessage(err) }).catch(() => undefined);
    }
  }

  async function runKind(entry: Running, kind: JobKind<unknown>, params: unknown): Promise<void> {
    const { job, cancel } = entry;
    const share = kind.persist ? (kind.computeShare ?? 0.5) : 1;
    const progress = progressWriter(db, job.id);
    const outcome: TaskOutcome = await pool.run({
      compute: kind.compute,
      computes: options.computes,
      params,
      timeoutMs: kind.timeoutMs,
      cancel: cancel.signal,
      graceMs: options.graceMs,
      onProgress: (fraction, item) => progress.report(fraction * share, item),
    });
    await progress.flush();
    if (outcome.status === "timeout") {
      await finishJob({ db, id: job.id, status: "failed", error: `stopped: exceeded its time bound of ${formatMs(outcome.timeoutMs)}` });
      return;
    }
    if (outcome.status === "error") {
      await finishJob({ db, id: job.id, status: "failed", error: outcome.message });
      return;
    }
    if (outcome.status === "cancelled") {
      await finishJob({ db, id: job.id, status: "cancelled", error: "cancelled on request", result: outcome.output ?? undefined });
      return;
    }
    let result = outcome.output;
    if (kind.persist) {
      result = await kind.persist({
        db,
        job,
        params,
        output: outcome.output,
        signal: cancel.signal,
        onProgress: (fraction, item) => progress.report(share + fraction * (1 - share), item),
      });
      await progress.flush();
      if (cancel.signal.aborted) {
        await finishJob({ db, id: job.id, status: "cancelled", error: "cancelled on request while saving results", result });
        return;
      }
    }
    await finishJob({ db, id: job.id, status: "succeeded", result, progress: 1 });
  }

  async function drain(): Promise<void> {
    for (;;) {
      await tick();
      if (running.size === 0) {
        const queued = await listQueuedJobs({ db, limit: 1 });
        if (queued.length === 0) return;
        continue;
      }
      await Promise.race([...running.values()].map((r) => r.done));
    }
  }

  return {
    async start() {
      if (timer) return;
      await recover();
      unsubscribe = onWakeJobRunner(() => void tick());
      timer = setInterval(() => void tick().catch((err) => console.error("job runner:", err)), options.pollMs ?? 1000);
      timer.unref();
      await tick();
    },
    tick,
    drain,
    recover,
    async stop() {
      stopped = true;
      clearInterval(timer);
      unsubscribe?.();
      await ticking;
      await Promise.all([...running.values()].map((r) => r.done));
      await pool.destroy();
    },
    runningCount: () => running.size,
  };

  function recover() {
    return recoverInterruptedJobs({ db, maxAttempts: MAX_JOB_ATTEMPTS });
  }
}

/** Progress writes at most every PROGRESS_WRITE_MS, in order, with the latest value kept. */
function progressWriter(db: Database, id: string) {
  let pending: { fraction: number; item: string | null } | null = null;
  let last = 0;
  let chain: Promise<void> = Promise.resolve();
  let timer: NodeJS.Timeout | undefined;
  const write = () => {
    timer = undefined;
    if (!pending) return;
    const { fraction, item } = pending;
    pending = null;
    last = Date.now();
    chain = chain.then(() => updateJobProgress({ db, id, progress: fraction, currentItem: item })).catch(() => undefined);
  };
  return {
    report(fraction: number, item: string | null) {
      pending = { fraction, item };
      if (timer) return;
      timer = setTimeout(write, Math.max(0, PROGRESS_WRITE_MS - (Date.now() - last)));
    },
    async flush() {
      clearTimeout(timer);
      write();
      await chain;
    },
  };
}

function publicMessage(err: unknown): string {
  if (isAppError(err)) return err.message;
  return "the job stopped on an unexpected error; see the server log";
}

function formatMs(ms: number): string {
  return ms % 1000 === 0 ? `${ms / 1000} s` : `${ms} ms`;
}
