import type { JobLane } from "@/db/queries/jobs";

/** One BullMQ queue per lane, so that small jobs have workers that large ones cannot take. */
export const BULLMQ_QUEUE_NAMES: Record<JobLane, string> = { small: "squarely-jobs-small", large: "squarely-jobs-large" };

/** What a BullMQ job carries: the jobs table row is the record, Redis only dispatches it. */
export type BullmqJobData = { jobId: string };

/**
 * Connection options from REDIS_URL. BullMQ's workers block on Redis, so requests are never given
 * up on (maxRetriesPerRequest null, as BullMQ requires for workers).
 */
export function redisConnection(url: string) {
  return { url, maxRetriesPerRequest: null };
}
