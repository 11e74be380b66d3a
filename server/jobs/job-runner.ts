import type { Database } from "@/db/client";
import { claimJob, listJobQueueState, recoverLapsedJobs } from "@/db/queries/jobs";
import { createJobExecutor, type JobExecutor } from "./executor";
import { pickJobs } from "./fairness";
import { onWakeJobRunner } from "./wake";

/** A job whose runner died runs once more; its runner dying again, it fails with a reason. */
export const MAX_JOB_ATTEMPTS = 2;
/** Queued jobs looked at per scheduling round (the fair pick chooses among them). */
const QUEUE_WINDOW = 200;

export type JobRunnerOptions = {
  db: Database;
  workers: number;
  /** Per-job memory bound in MB. @default 512 */
  memoryMb?: number;
  /** How often the runner looks for queued jobs and lapsed leases. @default 1000 */
  pollMs?: number;
  /** Time given to a cancelled computation to stop by itself before its thread is terminated. @default 3000 */
  graceMs?: number;
  /** File URL of a COMPUTES table other than the product's (tests register kinds of their own). */
  computes?: string;
  /** How long a claim holds without a heartbeat. @default 30000 */
  leaseMs?: number;
};

export type JobRunner = {
  /** Recovers lapsed jobs, then polls. */
  start(): Promise<void>;
  /** Recovers lapsed jobs and starts, fairly, what fits now; resolves when the claims are made. */
  tick(): Promise<void>;
  /** Runs until no job is queued or running here (the seed and tests use this). */
  drain(): Promise<void>;
  recover(): ReturnType<typeof recoverLapsedJobs>;
  /** Stops polling, waits for running jobs, and ends the worker threads. */
  stop(): Promise<void>;
  runningCount(): number;
  /** The lease owner this runner writes on the jobs it claims. */
  owner: string;
};

/**
 * The in-process runner: the jobs table is the queue. Any number of app processes may run one
 * against the same database: a claim is one conditional UPDATE (only one runner moves a job from
 * queued to running), the claim is a lease renewed by the executor's heartbeat, and a job whose
 * lease lapses (its process died) is re-queued or failed by whichever runner looks next.
 */
export function createJobRunner(options: JobRunnerOptions): JobRunner {
  const { db } = options;
  const workers = Math.max(1, options.workers);
  const executor: JobExecutor = createJobExecutor({ ...options, workers });
  const running = new Map<string, { lane: string; done: Promise<void> }>();
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
    await recover();
    const free = workers - running.size;
    if (free <= 0) return;
    const state = await listJobQueueState({ db, queuedLimit: QUEUE_WINDOW });
    const localLarge = [...running.values()].filter((r) => r.lane === "large").length;
    for (const candidate of pickJobs({ ...state, free, workers, localLarge })) {
      const job = await claimJob({ db, id: candidate.id, owner: executor.owner, leaseMs: executor.leaseMs });
      if (!job) continue;
      const done = executor.run(job).finally(() => {
        running.delete(job.id);
        void tick();
      });
      running.set(job.id, { lane: job.lane, done });
    }
  }

  async function drain(): Promise<void> {
    for (;;) {
      await tick();
      if (running.size === 0) {
        const { queued } = await listJobQueueState({ db, queuedLimit: 1 });
        if (queued.length === 0) return;
        continue;
      }
      await Promise.race([...running.values()].map((r) => r.done));
    }
  }

  function recover() {
    return recoverLapsedJobs({ db, maxAttempts: MAX_JOB_ATTEMPTS });
  }

  return {
    async start() {
      if (timer) return;
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
      await executor.stop();
    },
    runningCount: () => running.size,
    owner: executor.owner,
  };
}
