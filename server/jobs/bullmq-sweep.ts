import type { Database } from "@/db/client";
import { failLapsedJob, listUnheldJobs } from "@/db/queries/jobs";
import { addToLane, type BullmqLanes } from "./bullmq-lanes";
import { MAX_JOB_ATTEMPTS } from "./job-runner";

/** BullMQ states in which a job will still reach a worker (or is with one now). */
const LIVE_STATES = new Set(["waiting", "active", "delayed", "prioritized", "waiting-children"]);
/** Rows looked at per sweep, oldest first. */
const SWEEP_BATCH = 500;

export type SweepReport = { redispatched: string[]; failed: string[] };

/**
 * Reconciles the jobs table with BullMQ. A row that no runner holds — queued for longer than
 * `graceMs`, or running under a lapsed lease — while BullMQ holds no live job for it was lost on
 * the way: the app died between writing the row and adding it to Redis, Redis lost its data (it
 * runs without persistence here), or the worker that was to fail it after BullMQ gave up died too.
 * Such a row is added to its lane again (BullMQ's finished copy removed first), and the worker
 * that receives it claims it, takes it over as a new attempt, or fails it with a reason; a row that
 * has had its attempts is failed with a reason here. Any number of processes may sweep at once:
 * adding an id BullMQ holds is a no-op and every row change is conditional, and a delivery of a
 * row that meanwhile finished runs nothing (the worker's claim fails).
 */
export async function sweepLostJobs({
  db,
  lanes,
  graceMs,
  now = new Date(),
}: {
  db: Database;
  lanes: BullmqLanes;
  /** How long a queued row may wait for its BullMQ job to appear (enqueue writes the row, then adds it). */
  graceMs: number;
  now?: Date;
}): Promise<SweepReport> {
  const report: SweepReport = { redispatched: [], failed: [] };
  const rows = await listUnheldJobs({ db, queuedBefore: new Date(now.getTime() - graceMs), now, limit: SWEEP_BATCH });
  for (const row of rows) {
    const lane = lanes[row.lane];
    const state = await lane.getJobState(row.id);
    if (LIVE_STATES.has(state)) continue;
    if (row.status === "running" && row.attempts >= MAX_JOB_ATTEMPTS) {
      if (await failLapsedJob({ db, id: row.id, now })) report.failed.push(row.id);
      continue;
    }
    if (state === "completed" || state === "failed") await lane.remove(row.id);
    await addToLane(db, lanes, row);
    report.redispatched.push(row.id);
  }
  return report;
}
