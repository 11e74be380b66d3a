import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { Panel } from "@/components/ui/panel";
import { can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";
import { getJobKind, getJobQueue } from "@/server/jobs";
import { JobLive } from "./job-live";

export const metadata: Metadata = { title: "Job" };

export default async function JobPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { user, workspace, role } = await getWorkspaceContext();
  const job = await getJobQueue().get({ jobId: id, workspaceId: workspace.id });
  if (!job) notFound();
  const kind = getJobKind(job.kind);
  const canCancel = (job.ownerId === user.id && can(role, "job:cancel-own")) || can(role, "job:cancel-any");

  return (
    <div className="mx-auto max-w-4xl space-y-6 px-5 py-8">
      <div>
        <Link href="/jobs" className="text-sm text-tide-700 hover:underline">
          ← All jobs
        </Link>
        <h1 className="mt-2 text-3xl font-semibold tracking-tight text-tide-900">{kind?.title ?? job.kind}</h1>
        <p className="mt-1 text-sm text-ink-soft">{kind?.describe ? kind.describe(job.params) : null}</p>
      </div>
      <Panel>
        <JobLive initial={job} canCancel={canCancel} />
      </Panel>
      <Panel title="Details">
        <dl className="grid grid-cols-[max-content_minmax(0,1fr)] gap-x-6 gap-y-1 text-sm">
          <dt className="text-ink-faint">Job</dt>
          <dd className="font-mono text-xs">{job.id}</dd>
          <dt className="text-ink-faint">Queued</dt>
          <dd>{job.createdAt}</dd>
          <dt className="text-ink-faint">Started</dt>
          <dd>{job.startedAt ?? "—"}</dd>
          <dt className="text-ink-faint">Attempts</dt>
          <dd>{job.attempts}</dd>
          <dt className="text-ink-faint">Parameters</dt>
          <dd>
            <pre className="max-h-96 overflow-auto font-mono text-xs">{JSON.stringify(job.params, null, 2)}</pre>
          </dd>
        </dl>
      </Panel>
    </div>
  );
}
