import { env } from "@/env";
import { getDatabase } from "@/db/queries/connection";
import { createInProcessQueue } from "./in-process-queue";
import type { JobQueue } from "./queue";
import "./kinds";

export type { JobQueue, JobView, JobActor, EnqueueInput, ListJobsInput } from "./queue";
export { listJobKinds, getJobKind } from "./kinds/registry";

/**
 * The job queue every caller uses. Today the in-process queue on the jobs table; a distributed
 * implementation of the same interface would be returned here instead (see queue.ts).
 */
export function getJobQueue(): JobQueue {
  return createInProcessQueue({ db: getDatabase(), perUserLimit: env.JOBS_PER_USER });
}
