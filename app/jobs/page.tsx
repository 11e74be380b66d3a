import type { Metadata } from "next";
import Link from "next/link";
import { Panel } from "@/components/ui/panel";
import { JOB_STATUSES } from "@/db/schema";
import { listMembers } from "@/db/queries/memberships";
import { can, refusalReason } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";
import { isAppError } from "@/server/errors";
import { getJobKind, getJobQueue, listJobKinds } from "@/server/jobs";
import type { JobView } from "@/server/jobs/queue";
import { JobStatusBadge, ProgressBar } from "./job-status";
import { NewJobForm } from "./new-job-form";

export const metadata: Metadata = { title: "Jobs" };

type Search = { mine?: string; status?: string; cursor?: string };

function href(search: Search): string {
  const params = new URLSearchParams(Object.entries(search).filter((e): e is [string, string] => Boolean(e[1])));
  const text = params.toString();
  return text ? `/jobs?${text}` : "/jobs";
}

function describe(job: JobView): string {
  const kind = getJobKind(job.kind);
  return kind?.describe ? kind.describe(job.params) : JSON.stringify(job.params);
}

export default async function JobsPage({ searchParams }: { searchParams: Promise<Search> }) {
  const search = await searchParams;
  const { user, workspace, role } = await getWorkspaceContext();
  const status = JOB_STATUSES.find((s) => s === search.status);
  const mine = search.mine === "1";
  const queue = getJobQueue();
  let page: Awaited<ReturnType<typeof queue.list>>;
  try {
    page = await queue.list({ workspaceId: workspace.id, ownerId: mine ? user.id : undefined, status, cursor: search.cursor, limit: 25 });
  } catch (err) {
    if (!(isAppError(err) && err.field === "cursor")) throw err;
    page = await queue.list({ workspaceId: workspace.id, ownerId: mine ? user.id : undefined, status, limit: 25 });
  }
  const members = new Map((await listMembers({ workspaceId: workspace.id })).map((m) => [m.userId, m.name]));
  const kinds = listJobKinds()
    .filter((k) => !k.name.startsWith("test-"))
    .map((k) => ({ name: k.name, title: k.title, example: k.example ?? {} }));

  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <div>
        <h1 className="text-3xl font-semibold tracking-tight text-tide-900">Jobs</h1>
        <p className="mt-1 text-sm text-ink-soft">
          Atlas builds, searches, lumpings and large composite checks run in the background; each page updates while it runs.
        </p>
      </div>
      <div className="grid grid-cols-[minmax(0,1fr)] gap-6 lg:grid-cols-[minmax(0,1.7fr)_minmax(0,1fr)]">
        <Panel title="Recent jobs">
          <nav aria-label="Filter jobs" className="mb-4 flex flex-wrap gap-2 text-sm">
            <Link href={href({ status: search.status })} aria-current={!mine ? "page" : undefined} className={!mine ? "font-semibold text-tide-800" : "text-ink-soft hover:text-tide-700"}>
              Everyone&apos;s
            </Link>
            <Link href={href({ mine: "1", status: search.status })} aria-current={mine ? "page" : undefined} className={mine ? "font-semibold text-tide-800" : "text-ink-soft hover:text-tide-700"}>
              Mine
            </Link>
            <span className="text-ink-faint">·</span>
            {[undefined, ...JOB_STATUSES].map((s) => (
              <Link
                key={s ?? "all"}
                href={href({ mine: mine ? "1" : undefined, status: s })}
                aria-current={status === s ? "page" : undefined}
                className={status === s ? "font-semibold text-tide-800" : "text-ink-soft hover:text-tide-700"}
              >
                {s ?? "any status"}
              </Link>
            ))}
          </nav>
          {page.items.length === 0 ? (
            <p className="py-6 text-center text-sm text-ink-faint">No jobs here yet.</p>
          ) : (
            <div className="overflow-x-auto">
            <table className="w-full text-left text-sm">
              <thead className="text-xs uppercase tracking-wider text-ink-faint">
                <tr>
                  <th className="py-2 font-medium">Job</th>
                  <th className="py-2 font-medium">Status</th>
                  <th className="w-24 py-2 font-medium sm:w-40">Progress</th>
                  <th className="hidden py-2 font-medium sm:table-cell">Started by</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-line">
                {page.items.map((job) => (
                  <tr key={job.id}>
                    <td className="py-2 pr-3">
                      <Link href={`/jobs/${job.id}`} className="font-medium text-tide-800 hover:underline">
                        {getJobKind(job.kind)?.title ?? job.kind}
                      </Link>
                      <span className="block truncate text-xs text-ink-faint">{describe(job)}</span>
                    </td>
                    <td className="py-2 pr-3">
                      <JobStatusBadge status={job.status} />
                    </td>
                    <td className="py-2 pr-3">
                      <ProgressBar value={job.progress} label={`Progress of job ${job.id}`} />
                    </td>
                    <td className="hidden py-2 text-xs text-ink-soft sm:table-cell">
                      {job.ownerId ? (members.get(job.ownerId) ?? "a former member") : "—"}
                      <time className="block text-ink-faint" dateTime={job.createdAt}>
                        {new Date(job.createdAt).toISOString().slice(0, 16).replace("T", " ")} UTC
                      </time>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            </div>
          )}
          {page.nextCursor ? (
            <div className="mt-4 text-right text-sm">
              <Link href={href({ mine: mine ? "1" : undefined, status, cursor: page.nextCursor })} className="font-medium text-tide-700 hover:underline">
                Older jobs →
              </Link>
            </div>
          ) : null}
        </Panel>
        <Panel title="Start a job">
          {can(role, "job:create") ? (
            <NewJobForm kinds={kinds} />
          ) : (
            <p className="rounded-md bg-paper px-3 py-2 text-sm text-ink-soft">{refusalReason(role, "job:create")}</p>
          )}
        </Panel>
      </div>
    </div>
  );
}
