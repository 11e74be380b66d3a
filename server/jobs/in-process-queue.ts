import { can } from "@/lib/policy";
import type { Database } from "@/db/client";
import type { Job } from "@/db/schema";
import { createJobWithinLimit, getJob, listJobs, requestJobCancel } from "@/db/queries/jobs";
import { AppError } from "@/server/errors";
import { getJobKind, listJobKinds } from "./kinds/registry";
import { toJobView, type EnqueueInput, type JobActor, type JobQueue, type JobView, type ListJobsInput } from "./queue";
import { wakeJobRunner } from "./wake";

export type InProcessQueueOptions = {
  db: Database;
  /** Queued or running jobs one user may have at once. */
  perUserLimit: number;
};

/**
 * Validates a job against its kind and writes its row (queued, in its lane) within the owner's bound;
 * every queue implementation admits jobs this way. Throws AppError bad_input (400) or too_many_jobs (429).
 */
export async function admitJob({ db, perUserLimit, input }: InProcessQueueOptions & { input: EnqueueInput }): Promise<Job> {
  const kind = getJobKind(input.kind);
  if (!kind) {
    const known = listJobKinds().map((k) => k.name).join(", ");
    throw new AppError("bad_input", `Unknown job kind "${input.kind}"; known kinds: ${known}.`, { field: "kind" });
  }
  const parsed = kind.paramsSchema.safeParse(input.params);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = ["params", ...issue.path.map(String)].join(".");
    throw new AppError("bad_input", `${field}: ${issue.message}`, {
      field,
      details: parsed.error.issues.map((i) => ({ path: ["params", ...i.path.map(String)].join("."), message: i.message })),
    });
  }
  const created = await createJobWithinLimit({
    db,
    workspaceId: input.workspaceId,
    ownerId: input.ownerId,
    kind: kind.name,
    params: parsed.data,
    limit: perUserLimit,
    lane: kind.isSmall?.(parsed.data) ? "small" : "large",
  });
  if (!created.ok) {
    throw new AppError(
      "too_many_jobs",
      `You already have ${created.active} jobs queued or running; the limit is ${perUserLimit}. Wait for one to finish or cancel one.`,
      { details: { active: created.active, limit: perUserLimit } },
    );
  }
  return created.job;
}

/** Owner or admin only; a queued job is cancelled at once, a running one is flagged for its runner. */
export async function cancelJob({ db, jobId, workspaceId, actor }: { db: Database; jobId: string; workspaceId: string; actor: JobActor }): Promise<{ before: Job; after: Job }> {
  const job = await getJob({ db, id: jobId, workspaceId });
  if (!job) throw new AppError("not_found", `No job ${jobId} in this workspace.`, { field: "id" });
  const own = job.ownerId === actor.userId && can(actor.role, "job:cancel-own");
  if (!own && !can(actor.role, "job:cancel-any")) {
    throw new AppError("forbidden", "Only the job's owner or an admin may cancel it.");
  }
  if (job.status !== "queued" && job.status !== "running") return { before: job, after: job };
  const updated = await requestJobCancel({ db, id: jobId });
  return { before: job, after: updated ?? job };
}

export async function getJobView({ db, jobId, workspaceId }: { db: Database; jobId: string; workspaceId: string }): Promise<JobView | null> {
  const job = await getJob({ db, id: jobId, workspaceId });
  return job ? toJobView(job) : null;
}

export async function listJobViews({ db, input }: { db: Database; input: ListJobsInput }) {
  const page = await listJobs({ db, ...input });
  return { items: page.items.map(toJobView), nextCursor: page.nextCursor };
}

/** The JobQueue on the jobs table; `createJobRunner` (in this or another app process) executes what it queues. */
export function createInProcessQueue(options: InProcessQueueOptions): JobQueue {
  const { db } = options;
  return {
    async enqueue(input) {
      const job = await admitJob({ ...options, input });
      wakeJobRunner();
      return toJobView(job);
    },
    async cancel(input) {
      const { after } = await cancelJob({ db, ...input });
      wakeJobRunner();
      return toJobView(after);
    },
    get: (input) => getJobView({ db, ...input }),
    list: (input) => listJobViews({ db, input }),
  };
}
