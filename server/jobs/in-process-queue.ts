import { can } from "@/lib/policy";
import type { Database } from "@/db/client";
import { createJobWithinLimit, getJob, listJobs, requestJobCancel } from "@/db/queries/jobs";
import { AppError } from "@/server/errors";
import { getJobKind, listJobKinds } from "./kinds/registry";
import { toJobView, type JobQueue } from "./queue";
import { wakeJobRunner } from "./wake";

export type InProcessQueueOptions = {
  db: Database;
  /** Queued or running jobs one user may have at once. */
  perUserLimit: number;
};

/** The JobQueue on the jobs table; `createJobRunner` executes what it queues. */
export function createInProcessQueue(options: InProcessQueueOptions): JobQueue {
  const { db, perUserLimit } = options;

  return {
    async enqueue(input) {
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
      });
      if (!created.ok) {
        throw new AppError(
          "too_many_jobs",
          `You already have ${created.active} jobs queued or running; the limit is ${perUserLimit}. Wait for one to finish or cancel one.`,
          { details: { active: created.active, limit: perUserLimit } },
        );
      }
      wakeJobRunner();
      return toJobView(created.job);
    },

    async cancel({ jobId, workspaceId, actor }) {
      const job = await getJob({ db, id: jobId, workspaceId });
      if (!job) throw new AppError("not_found", `No job ${jobId} in this workspace.`, { field: "id" });
      const own = job.ownerId === actor.userId && can(actor.role, "job:cancel-own");
      if (!own && !can(actor.role, "job:cancel-any")) {
        throw new AppError("forbidden", "Only the job's owner or an admin may cancel it.");
      }
      if (job.status !== "queued" && job.status !== "running") return toJobView(job);
      const updated = await requestJobCancel({ db, id: jobId });
      wakeJobRunner();
      return toJobView(updated ?? job);
    },

    async get({ jobId, workspaceId }) {
      const job = await getJob({ db, id: jobId, workspaceId });
      return job ? toJobView(job) : null;
    },

    async list(input) {
      const page = await listJobs({ db, ...input });
      return { items: page.items.map(toJobView), nextCursor: page.nextCursor };
    },
  };
}
