import "server-only";
import { getMapLines, listAuditEvents, listFinishedJobs, type AuditRow, type MapLine } from "@/db/queries/audit";
import { getJobKind } from "@/server/jobs/kinds/registry";
import "@/server/jobs/kinds";

export type LogLine = { id: string; text: string; href: string | null; actorName: string | null; at: Date; action: string };

/** "ECA 146 → ECA 128, projection at block 3" */
export function mapPhrase(m: Pick<MapLine, "kind" | "block" | "steps" | "sourceName" | "targetName">): string {
  const shape = m.block ? ` at block ${m.block}` : m.steps && m.steps > 1 ? ` in ${m.steps} steps` : "";
  return `${m.sourceName} → ${m.targetName}, ${m.kind}${shape}`;
}

/** One audit event in words, naming who did it. */
export function describeEvent(e: Pick<AuditRow, "action" | "detail" | "subjectId" | "subjectType" | "actorName">, map?: MapLine): { text: string; href: string | null } {
  const who = e.actorName ?? "Someone";
  const d = e.detail;
  const str = (k: string) => (typeof d[k] === "string" ? (d[k] as string) : "");
  switch (e.action) {
    case "map:create":
      return { text: map ? `${who} certified ${mapPhrase(map)}` : `${who} certified a map`, href: `/atlas/maps/${e.subjectId}` };
    case "map:retract":
      return { text: `${who} retracted ${map ? mapPhrase(map) : "a map"}${str("reason") ? `: “${str("reason")}”` : ""}`, href: `/atlas/maps/${e.subjectId}` };
    case "chain:create":
      return { text: `${who} certified a chain${str("name") ? ` “${str("name")}”` : ""}`, href: null };
    case "note:post":
      return { text: `${who}: ${str("text")}`, href: null };
    case "member:invite":
      return { text: `${who} ${d.resent ? "re-sent the invitation of" : "invited"} ${str("email")} as ${str("role")}`, href: "/members" };
    case "member:join":
      return { text: `${who} joined as ${str("role")}`, href: "/members" };
    case "member:change-role":
      return { text: `${who} changed a member's role to ${str("role")}`, href: "/members" };
    case "member:remove":
      return { text: `${who} removed a member`, href: "/members" };
    case "invitation:revoke":
      return { text: `${who} revoked the invitation of ${str("email")}`, href: "/members" };
    case "workspace:create":
      return { text: `${who} created the workspace`, href: null };
    case "workspace:publish":
      return { text: `${who} turned the public view ${d.on ? "on" : "off"}`, href: null };
    case "token:create":
      return { text: `${who} created an API token`, href: null };
    case "token:revoke":
      return { text: `${who} revoked an API token`, href: null };
    case "annotation:add":
      return { text: `${who} added a ${str("kind") || "note"} to a ${str("subjectType") || "record"}: ${str("text")}`, href: null };
    default:
      return { text: `${who}: ${e.action.replace(":", " ")} (${e.subjectType})`, href: null };
  }
}

type FinishedJob = Awaited<ReturnType<typeof listFinishedJobs>>[number];

function jobPhrase(job: FinishedJob, certified: number): string {
  const kind = getJobKind(job.kind);
  let params: unknown = null;
  let result: { found?: unknown; certificates?: { created?: unknown } } = {};
  try {
    params = JSON.parse(job.params);
    result = job.result ? JSON.parse(job.result) : {};
  } catch {
    /* shown without detail */
  }
  const what = kind?.describe?.(params) ?? "";
  const found = typeof result.found === "number" ? result.found : null;
  const created = typeof result.certificates?.created === "number" ? result.certificates.created : certified;
  const counts = found !== null ? `${found} coarse-grainings certified, ${created} new maps` : `${created} new maps`;
  return `${job.ownerName ?? "Someone"}'s ${kind?.title ?? job.kind} job${what ? `, ${what}` : ""}: ${counts}`;
}

/**
 * The workspace log in words. Maps that a job wrote (its owner's map:create events between its
 * start and finish) fold into one line for the job, with counts and a link to it.
 */
export async function readableLog({ workspaceId, limit = 15 }: { workspaceId: string; limit?: number }): Promise<LogLine[]> {
  const [{ items }, finished] = await Promise.all([listAuditEvents({ workspaceId, limit: limit * 20 }), listFinishedJobs({ workspaceId })]);
  const jobOf = (e: AuditRow) =>
    e.action === "map:create"
      ? finished.find((j) => j.ownerId === e.actorId && j.startedAt && j.finishedAt && e.createdAt >= j.startedAt && e.createdAt <= j.finishedAt)
      : undefined;
  const perJob = new Map<string, number>();
  for (const e of items) {
    const job = jobOf(e);
    if (job) perJob.set(job.id, (perJob.get(job.id) ?? 0) + 1);
  }
  const mapIds = items.filter((e) => e.subjectType === "map" && !jobOf(e)).map((e) => e.subjectId);
  const names = await getMapLines({ workspaceId, mapIds: mapIds.slice(0, 500) });
  const lines: LogLine[] = [];
  const shown = new Set<string>();
  for (const e of items) {
    const job = jobOf(e);
    if (job) {
      if (shown.has(job.id)) continue;
      shown.add(job.id);
      lines.push({ id: `job-${job.id}`, text: jobPhrase(job, perJob.get(job.id) ?? 0), href: `/jobs/${job.id}`, actorName: job.ownerName, at: job.finishedAt ?? e.createdAt, action: "job" });
    } else {
      const { text, href } = describeEvent(e, names.get(e.subjectId));
      lines.push({ id: e.id, text, href, actorName: e.actorName, at: e.createdAt, action: e.action });
    }
    if (lines.length >= limit) break;
  }
  return lines;
}
