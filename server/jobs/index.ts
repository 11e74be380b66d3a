import { env } from "@/env";
import { getDatabase } from "@/db/queries/connection";
import { createBullmqQueue, type BullmqJobQueue } from "./bullmq-queue";
import { createInProcessQueue } from "./in-process-queue";
import type { JobQueue } from "./queue";
import "./kinds";

export type { JobQueue, JobView, JobActor, EnqueueInput, ListJobsInput } from "./queue";
export { listJobKinds, getJobKind } from "./kinds/registry";

const globalForQueue = globalThis as unknown as { squarelyBullmqQueue?: BullmqJobQueue };

/** Names the missing setting rather than failing later on a connection. */
export function requireRedisUrl(): string {
  if (!env.REDIS_URL) throw new Error("JOB_QUEUE=bullmq needs REDIS_URL (for example redis://127.0.0.1:6379)");
  return env.REDIS_URL;
}

/**
 * The job queue every caller uses: by default the in-process queue on the jobs table; with
 * JOB_QUEUE=bullmq, BullMQ over Redis (one connection per process, kept), run by worker processes.
 */
export function getJobQueue(): JobQueue {
  if (env.JOB_QUEUE === "bullmq") {
    globalForQueue.squarelyBullmqQueue ??= createBullmqQueue({ db: getDatabase(), perUserLimit: env.JOBS_PER_USER, redisUrl: requireRedisUrl() });
    return globalForQueue.squarelyBullmqQueue;
  }
  return createInProcessQueue({ db: getDatabase(), perUserLimit: env.JOBS_PER_USER });
}
