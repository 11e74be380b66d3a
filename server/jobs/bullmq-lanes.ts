import { Queue } from "bullmq";
import type { Database } from "@/db/client";
import type { Job } from "@/db/schema";
import { countActiveJobs, type JobLane } from "@/db/queries/jobs";

/** One BullMQ queue per lane, so that small jobs have workers that large ones cannot take. */
export const BULLMQ_QUEUE_NAMES: Record<JobLane, string> = { small: "squarely-jobs-small", large: "squarely-jobs-large" };

/** What a BullMQ job carries: the jobs table row is the record, Redis only dispatches it. */
export type BullmqJobData = { jobId: string };

export type BullmqLanes = Record<JobLane, Queue<BullmqJobData>>;

/**
 * Connection options from REDIS_URL. BullMQ's workers block on Redis, so requests are never given
 * up on (maxRetriesPerRequest null, as BullMQ requires for workers).
 */
export function redisConnection(url: string) {
  return { url, maxRetriesPerRequest: null };
}

/** The producer side of both lanes, on one Redis. */
export function openBullmqLanes(redisUrl: string): BullmqLanes & { close(): Promise<void> } {
  const connection = redisConnection(redisUrl);
  const small = new Queue<BullmqJobData>(BULLMQ_QUEUE_NAMES.small, { connection });
  const large = new Queue<BullmqJobData>(BULLMQ_QUEUE_NAMES.large, { connection });
  return { small, large, close: async () => void (await Promise.all([small.close(), large.close()])) };
}

/**
 * Hands a job row to its lane, with the row's id as BullMQ's job id: adding an id BullMQ still
 * holds is a no-op, so a job is never in Redis twice.
 */
export async function addToLane(db: Database, lanes: BullmqLanes, job: Job): Promise<void> {
  await lanes[job.lane].add(job.kind, { jobId: job.id }, { jobId: job.id, priority: await fairPriority(db, job), removeOnComplete: true, removeOnFail: 1000 });
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
