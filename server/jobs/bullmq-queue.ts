import type { Database } from "@/db/client";
import type { Job } from "@/db/schema";
import { finishJob } from "@/db/queries/jobs";
import { AppError } from "@/server/errors";
import { addToLane, openBullmqLanes } from "./bullmq-lanes";
import { admitJob, cancelJob, getJobView, listJobViews } from "./in-process-queue";
import { toJobView, type JobQueue } from "./queue";

export type BullmqQueueOptions = { db: Database; perUserLimit: number; redisUrl: string };

export type BullmqJobQueue = JobQueue & { close(): Promise<void> };

/**
 * The JobQueue on BullMQ over Redis: jobs are admitted into the jobs table exactly as in-process
 * (validation, per-person bound, lane) and then dispatched through the lane's BullMQ queue with the
 * row's id as BullMQ's job id; separate worker processes (bullmq-worker.ts) run them. The table
 * stays the record that get/list read and that cancel flags.
 */
export function createBullmqQueue(options: BullmqQueueOptions): BullmqJobQueue {
  const { db } = options;
  const lanes = openBullmqLanes(options.redisUrl);

  async function dispatch(job: Job): Promise<void> {
    try {
      await addToLane(db, lanes, job);
    } catch (err) {
      console.error(`job ${job.id}: could not reach the job queue:`, err);
      await finishJob({ db, id: job.id, status: "failed", error: "the job queue (Redis) could not be reached; nothing ran" });
      throw new AppError("internal", "The job queue could not be reached; the job was not started. Try again shortly.");
    }
  }

  return {
    async enqueue(input) {
      const job = await admitJob({ db, perUserLimit: options.perUserLimit, input });
      await dispatch(job);
      return toJobView(job);
    },
    async cancel(input) {
      const { before, after } = await cancelJob({ db, ...input });
      // A queued job is cancelled in the table already; taking it off Redis only saves a delivery.
      if (before.status === "queued") await lanes[before.lane].remove(before.id).catch(() => undefined);
      return toJobView(after);
    },
    get: (input) => getJobView({ db, ...input }),
    list: (input) => listJobViews({ db, input }),
    async close() {
      await lanes.close();
    },
  };
}
