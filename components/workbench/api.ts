import type { ApiCall } from "./certifyWorkbench";

/** The page's own API client: same-origin JSON requests with the session cookie. */
export const browserApi: ApiCall = async (method, path, body) => {
  const response = await fetch(path, {
    method,
    headers: body === undefined ? undefined : { "content-type": "application/json" },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await response.text();
  let json: unknown = null;
  try {
    json = text ? JSON.parse(text) : null;
  } catch {
    json = { error: { message: `The server answered ${response.status}.` } };
  }
  return { status: response.status, body: json };
};

export type JobSnapshot = { id: string; status: string; progress: number; currentItem: string | null; result: unknown; error: string | null };

/** Starts a job and follows it until it ends, reporting its progress; throws with the server's message. */
export async function runJob(kind: string, params: unknown, onProgress: (job: JobSnapshot) => void, pollMs = 700): Promise<JobSnapshot> {
  const started = await browserApi("POST", "/api/jobs", { kind, params });
  if (started.status >= 300) throw new Error((started.body as { error?: { message?: string } })?.error?.message ?? "The job was not started.");
  let job = started.body as JobSnapshot;
  onProgress(job);
  while (job.status === "queued" || job.status === "running") {
    await new Promise((r) => setTimeout(r, pollMs));
    const res = await browserApi("GET", `/api/jobs/${job.id}`);
    if (res.status >= 300) throw new Error("The job could not be followed.");
    job = res.body as JobSnapshot;
    onProgress(job);
  }
  if (job.status !== "succeeded") throw new Error(job.error ?? `The job ${job.status}.`);
  return job;
}

export function newId(prefix: string): string {
  return `${prefix}${Date.now().toString(36)}${Math.random().toString(36).slice(2, 7)}`;
}
