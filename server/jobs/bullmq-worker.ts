import { Worker, type Job as BullmqJob } from "bullmq";
import type { Database } from "@/db/client";
import type { Job } from "@/db/schema";
import { claimJob, failLapsedJob, getJob, takeOverLapsedJob } from "@/db/queries/jobs";
import { BULLMQ_QUEUE_NAMES, openBullmqLanes, redisConnection, type BullmqJobData } from "./bullmq-lanes";
import { sweepLostJobs } from "./bullmq-sweep";
import { createJobExecutor, type JobExecutorOptions } from "./executor";
import { largeJobCap } from "./fairness";
import { MAX_JOB_ATTEMPTS } from "./job-runner";

export type BullmqWorkerOptions = Omit<JobExecutorOptions, "workers"> & {
  redisUrl: string;
  /** Worker threads in all: large jobs get `largeJobCap(workers)` of them, small jobs the rest (at least one). */
  workers: number;
  /** How often this process sweeps for jobs BullMQ lost (bullmq-sweep.ts). @default the lease */
  sweepMs?: number;
};

export type BullmqJobWorker = { owner: string; close(): Promise<void> };

/**
 * A worker process's side of the BullMQ queue: one BullMQ Worker per lane, whose lock (renewed by
 * BullMQ, `lockDuration` = the lease) and stalled-job check bring a job whose process died back to
 * another worker; the jobs table row is claimed under the same lease, so a job runs in one place at
 * a time. A job stalled a second time is failed by BullMQ, and its row with a reason here. Every
 * `sweepMs` the process also looks for rows that BullMQ no longer holds and dispatches or fails them.
 */
export async function startBullmqWorker(options: BullmqWorkerOptions): Promise<BullmqJobWorker> {
  const { db } = options;
  const large = largeJobCap(options.workers);
  const small = Math.max(1, options.workers - large);
  const executor = createJobExecutor({ ...options, workers: large + small });
  const leaseMs = executor.leaseMs;
  const connection = redisConnection(options.redisUrl);
  const settings = { connection, lockDuration: leaseMs, stalledInterval: leaseMs, maxStalledCount: MAX_JOB_ATTEMPTS - 1 };

  const processor = async (delivered: BullmqJob<BullmqJobData>) => {
    const job = await claimForRun(db, delivered.data.jobId, executor.owner, leaseMs);
    if (job) await executor.run(job);
  };
  const workers = [
    new Worker<BullmqJobData>(BULLMQ_QUEUE_NAMES.small, processor, { ...settings, concurrency: small }),
    new Worker<BullmqJobData>(BULLMQ_QUEUE_NAMES.large, processor, { ...settings, concurrency: large }),
  ];
  for (const worker of workers) {
    worker.on("failed", (delivered) => {
      // BullMQ gave up on a job that stalled too often: its row fails with a reason, never stays running.
      // Its lease may outlive BullMQ's lock by a heartbeat, so look again once it surely lapsed.
      if (!delivered) return;
      const fail = () => failLapsedJob({ db, id: delivered.data.jobId }).catch(() => null);
      void fail().then((row) => row ?? new Promise((r) => setTimeout(r, leaseMs + 1_000).unref()).then(fail));
    });
    worker.on("error", (err) => console.error("job worker:", err.message));
  }
  await Promise.all(workers.map((w) => w.waitUntilReady()));
  const sweeper = startSweeper(db, options.redisUrl, leaseMs, options.sweepMs ?? leaseMs);

  return {
    owner: executor.owner,
    async close() {
      await sweeper.stop();
      await Promise.all(workers.map((w) => w.close()));
      await executor.stop();
    },
  };
}

/**
 * The row of a delivered job, claimed for this worker: queued → running; running under a lapsed
 * lease (its worker died; BullMQ brought it back) → taken over as a new attempt, or failed when it
 * has had its attempts; running under a held lease → waited for up to one lease, since BullMQ may
 * notice a stall a little before the row's lease runs out. Null when there is nothing to run.
 */
async function claimForRun(db: Database, id: string, owner: string, leaseMs: number): Promise<Job | null> {
  const deadline = Date.now() + leaseMs + 1_000;
  for (;;) {
    const claimed = await claimJob({ db, id, owner, leaseMs });
    if (claimed) return claimed;
    const row = await getJob({ db, id });
    if (!row || row.status !== "running") return null;
    const lapsed = row.leaseExpiresAt === null || row.leaseExpiresAt.getTime() < Date.now();
    if (lapsed && row.attempts >= MAX_JOB_ATTEMPTS) {
      await failLapsedJob({ db, id });
      return null;
    }
    if (lapsed) {
      const taken = await takeOverLapsedJob({ db, id, owner, leaseMs });
      if (taken) return taken;
    }
    if (Date.now() > deadline) return null;
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** Sweeps for lost jobs now and every `intervalMs`, one sweep at a time. */
function startSweeper(db: Database, redisUrl: string, graceMs: number, intervalMs: number) {
  const lanes = openBullmqLanes(redisUrl);
  let sweeping: Promise<unknown> | null = null;
  const sweep = () => {
    sweeping ??= sweepLostJobs({ db, lanes, graceMs })
      .then((report) => {
        if (report.redispatched.length + report.failed.length === 0) return;
        console.log(`job sweep: ${report.redispatched.length} lost job(s) dispatched again, ${report.failed.length} failed`);
      })
      .catch((err: Error) => console.error("job sweep:", err.message))
      .finally(() => {
        sweeping = null;
      });
  };
  sweep();
  const timer = setInterval(sweep, intervalMs);
  timer.unref();
  return {
    async stop() {
      clearInterval(timer);
      await sweeping;
      await lanes.close();
    },
  };
}
