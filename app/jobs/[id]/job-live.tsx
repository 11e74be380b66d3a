"use client";

import { useState } from "react";
import useSWR from "swr";
import { buttonClass } from "@/components/ui/button";
import type { JobView } from "@/server/jobs/queue";
import { JobResultView } from "../job-result";
import { JobStatusBadge, ProgressBar } from "../job-status";

async function fetchJob(url: string): Promise<JobView> {
  const response = await fetch(url);
  const body = await response.json();
  if (!response.ok) throw new Error(body?.error?.message ?? `request failed (${response.status})`);
  return body as JobView;
}

const active = (job: JobView | undefined) => job?.status === "queued" || job?.status === "running";

/** The live part of a job page: polls GET /api/jobs/:id through swr while the job is queued or running. */
export function JobLive({ initial, canCancel }: { initial: JobView; canCancel: boolean }) {
  const { data, mutate } = useSWR<JobView>(`/api/jobs/${initial.id}`, fetchJob, {
    fallbackData: initial,
    // Before the first answer swr passes undefined (fallback data is not in its cache): poll then too.
    refreshInterval: (latest) => (active(latest ?? initial) ? 1000 : 0),
  });
  const [cancelError, setCancelError] = useState<string | null>(null);
  const job = data ?? initial;

  async function cancel() {
    setCancelError(null);
    const response = await fetch(`/api/jobs/${job.id}/cancel`, { method: "POST" });
    const body = await response.json();
    if (!response.ok) setCancelError(body?.error?.message ?? "The job could not be cancelled.");
    else await mutate(body as JobView, { revalidate: false });
  }

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <JobStatusBadge status={job.status} />
        <span className="font-mono text-sm text-tide-900">{Math.round(job.progress * 100)}%</span>
        {job.cancelRequested && active(job) ? <span className="text-sm text-ink-soft">stopping…</span> : null}
        {canCancel && active(job) && !job.cancelRequested ? (
          <button type="button" onClick={cancel} className={buttonClass("secondary", "ml-auto")}>
            Cancel job
          </button>
        ) : null}
      </div>
      <ProgressBar value={job.progress} label="Job progress" />
      <p className="text-sm text-ink-soft" aria-live="polite">
        {job.currentItem ?? (job.status === "queued" ? "Waiting for a free worker." : "")}
      </p>
      {cancelError ? (
        <p role="alert" className="rounded-md bg-brick-50 px-3 py-2 text-sm text-brick-700">
          {cancelError}
        </p>
      ) : null}
      {job.error ? (
        <p className={`rounded-md px-3 py-2 text-sm ${job.status === "cancelled" ? "bg-saffron-100 text-saffron-700" : "bg-brick-50 text-brick-700"}`}>
          {job.error}
        </p>
      ) : null}
      {job.finishedAt ? (
        <p className="text-sm text-ink-soft" data-finished-at>
          Finished {job.finishedAt.slice(0, 19).replace("T", " ")} UTC
        </p>
      ) : null}
      {job.result !== null && job.result !== undefined ? (
        <>
          <JobResultView result={job.result} params={job.params} />
          <details>
            <summary className="cursor-pointer text-sm font-medium text-tide-800">Result as JSON</summary>
            <pre className="mt-2 max-h-96 overflow-auto rounded-md bg-paper p-3 font-mono text-xs">{JSON.stringify(job.result, null, 2)}</pre>
          </details>
        </>
      ) : null}
    </div>
  );
}
