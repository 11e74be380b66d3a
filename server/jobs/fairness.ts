import type { JobSlot } from "@/db/queries/jobs";

export type PickJobsInput = {
  /** Queued jobs, oldest first. */
  queued: JobSlot[];
  /** Every running job, of every runner (the shares are counted across processes). */
  running: JobSlot[];
  /** Workers this runner has free now. */
  free: number;
  /** Workers this runner has in all. */
  workers: number;
  /** Large jobs this runner runs now. */
  localLarge: number;
};

/**
 * Large jobs may hold all but one of a runner's workers, so that a small job never waits for a
 * large one to finish (a runner with one worker cannot keep one back).
 */
export function largeJobCap(workers: number): number {
  return workers > 1 ? workers - 1 : 1;
}

/**
 * Which queued jobs a runner starts now, fairly: each pick goes to the workspace with the fewest
 * running jobs, then to the person with the fewest, then to the oldest job; large jobs only while
 * they hold fewer than `largeJobCap` of this runner's workers. Work-conserving: a worker is left
 * idle only when every queued job is large and the cap is reached.
 */
export function pickJobs(input: PickJobsInput): JobSlot[] {
  const perWorkspace = countBy(input.running, (j) => j.workspaceId);
  const perOwner = countBy(input.running, (j) => j.ownerId ?? "");
  const cap = largeJobCap(input.workers);
  let large = input.localLarge;
  const left = [...input.queued];
  const picked: JobSlot[] = [];
  while (picked.length < input.free) {
    const eligible = left.filter((j) => j.lane === "small" || large < cap);
    if (eligible.length === 0) break;
    const next = eligible.reduce((best, j) => (fairOrder(j, best, perWorkspace, perOwner) < 0 ? j : best));
    left.splice(left.indexOf(next), 1);
    picked.push(next);
    if (next.lane === "large") large++;
    perWorkspace.set(next.workspaceId, (perWorkspace.get(next.workspaceId) ?? 0) + 1);
    perOwner.set(next.ownerId ?? "", (perOwner.get(next.ownerId ?? "") ?? 0) + 1);
  }
  return picked;
}

function fairOrder(a: JobSlot, b: JobSlot, perWorkspace: Map<string, number>, perOwner: Map<string, number>): number {
  return (
    (perWorkspace.get(a.workspaceId) ?? 0) - (perWorkspace.get(b.workspaceId) ?? 0) ||
    (perOwner.get(a.ownerId ?? "") ?? 0) - (perOwner.get(b.ownerId ?? "") ?? 0) ||
    a.createdAt.getTime() - b.createdAt.getTime() ||
    (a.id < b.id ? -1 : a.id > b.id ? 1 : 0)
  );
}

function countBy<T>(items: T[], key: (item: T) => string): Map<string, number> {
  const counts = new Map<string, number>();
  for (const item of items) counts.set(key(item), (counts.get(key(item)) ?? 0) + 1);
  return counts;
}
