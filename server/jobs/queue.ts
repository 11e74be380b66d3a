import type { Role } from "@/lib/policy";
import type { Job } from "@/db/schema";

/**
 * What callers (route handlers, pages, the seed, the CLI) know of the job system. Nothing outside
 * server/jobs/ touches the jobs table, the worker pool or the runner directly.
 *
 * The one implementation today is in-process (`createInProcessQueue`): the jobs table is the queue
 * and a tinypool worker pool in the app process runs it. When one machine is not enough, a
 * distributed implementation — BullMQ on Redis, with separate worker processes running the same
 * job kinds from server/jobs/kinds/ — can implement this same interface (enqueue → Queue.add,
 * cancel → a cancel flag the worker polls plus Job.remove for waiting jobs, get/list → the jobs
 * table kept as the record of each job's progress and result) and be returned by `getJobQueue()`
 * instead, without changing any caller.
 */
export interface JobQueue {
  /** Validates params with the kind's schema; throws AppError bad_input (400) or too_many_jobs (429). */
  enqueue(input: EnqueueInput): Promise<JobView>;
  /** Owner or admin only; throws AppError not_found (404) or forbidden (403). Finished jobs are returned unchanged. */
  cancel(input: { jobId: string; workspaceId: string; actor: JobActor }): Promise<JobView>;
  get(input: { jobId: string; workspaceId: string }): Promise<JobView | null>;
  list(input: ListJobsInput): Promise<{ items: JobView[]; nextCursor: string | null }>;
}

export type EnqueueInput = { workspaceId: string; ownerId: string; kind: string; params: unknown };
export type JobActor = { userId: string; role: Role };
export type ListJobsInput = {
  workspaceId: string;
  ownerId?: string;
  kind?: string;
  status?: Job["status"];
  cursor?: string | null;
  limit?: number;
};

/** A job as the API and pages show it (JSON columns parsed, dates as ISO strings). */
export type JobView = {
  id: string;
  workspaceId: string;
  ownerId: string | null;
  kind: string;
  params: unknown;
  status: Job["status"];
  progress: number;
  currentItem: string | null;
  result: unknown;
  error: string | null;
  attempts: number;
  cancelRequested: boolean;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
};

export function toJobView(job: Job): JobView {
  return {
    id: job.id,
    workspaceId: job.workspaceId,
    ownerId: job.ownerId,
    kind: job.kind,
    params: parseJson(job.params),
    status: job.status,
    progress: job.progress,
    currentItem: job.currentItem,
    result: job.result === null ? null : parseJson(job.result),
    error: job.error,
    attempts: job.attempts,
    cancelRequested: job.cancelRequested,
    createdAt: job.createdAt.toISOString(),
    startedAt: job.startedAt?.toISOString() ?? null,
    finishedAt: job.finishedAt?.toISOString() ?? null,
  };
}

function parseJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return null;
  }
}
