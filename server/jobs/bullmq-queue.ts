import { Queue } from "bullmq";
import type { Database } from "@/db/client";
import type { Job } from "@/db/schema";
import { countActiveJobs, finishJob } from "@/db/queries/jobs";
import { AppError } from "@/server/errors";
import { BULLMQ_QUEUE_NAMES, redisConnection, type BullmqJobData } from "./bullmq-lanes";
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
  const connection = redisConnection(options.redisUrl);
  const lanes = {
    small: new Queue<BullmqJobData>(BULLMQ_QUEUE_NAMES.small, { connection }),
    large: new Queue<BullmqJobData>(BULLMQ_QUEUE_NAMES.large, { connection }),
  };

  async function dispatch(job: Job): Promise<void> {
    try {
      await lanes[job.lane].add(job.kind, { jobId: job.id }, {
        jobId: job.id,
        priority: await fairPriority(db, job),
        removeOnComplete: true,
        removeOnFail: 1000,
      });
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
      await Promise.all([lanes.small.close(), lanes.large.close()]);
    },
  };
}

/**
 * BullMQ serves a lane by priority (lower first) and then in order: a job's priority grows with the
 * jobs its workspace and its owner already have queued or running, so a workspace with one job is
 * served before the tenth job of another.
 */
async function fairPriority(db: Database, job: Job): Promise<number> {
  const { workspace, owner } = await countActiveJobs({ db, workspaceId: job.workspaceId, ownerId: job.ownerId });
  return Math.min(2_000_000, workspace + owner);
}
