import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { setDatabase } from "@/db/queries/connection";
import { setSessionReader } from "@/app/api/_lib/actor";
import { registerJobKind } from "@/server/jobs/kinds/registry";
import { defineJobKind } from "@/server/jobs/kinds/types";
import { createJobRunner, type JobRunner } from "@/server/jobs/job-runner";
import { env } from "@/env";
import * as jobsRoute from "@/app/api/jobs/route";
import * as jobRoute from "@/app/api/jobs/[id]/route";
import * as cancelRoute from "@/app/api/jobs/[id]/cancel/route";
import { SleepAndCountParams } from "./jobs-sleep-kind";
import { TEST_COMPUTES } from "./jobs-computes";
import { seedPeople, waitFor } from "./jobs-fixtures";

registerJobKind(defineJobKind({ name: "test-sleep-and-count", title: "Count", paramsSchema: SleepAndCountParams, compute: "test-sleep-and-count", timeoutMs: 20_000 }));

let t: TestDatabase;
let people: Awaited<ReturnType<typeof seedPeople>>["people"];
let signedIn: { id: string; email: string; name: string } | null = null;
let runner: JobRunner | null = null;

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  ({ people } = await seedPeople(t.db));
  setSessionReader(async () => signedIn);
});

afterAll(async () => {
  await runner?.stop();
  setSessionReader(null);
  setDatabase(null);
  t.cleanup();
});

const as = (who: { id: string; email: string } | null) => {
  signedIn = who ? { id: who.id, email: who.email, name: who.email } : null;
};
// What the app's own pages send with a cookie-authenticated write.
const SAME_SITE_JSON = { origin: "http://test", "content-type": "application/json" };
const noParams = { params: Promise.resolve({}) as Promise<Record<string, never>> };
const idParams = (id: string) => ({ params: Promise.resolve({ id }) });
const post = (body: unknown) =>
  jobsRoute.POST(
    new Request("http://test/api/jobs", { method: "POST", headers: SAME_SITE_JSON, body: typeof body === "string" ? body : JSON.stringify(body) }),
    noParams,
  );

describe("the jobs API", () => {
  it("answers 401 signed out and 403 to a viewer creating a job", async () => {
    as(null);
    expect((await post({ kind: "test-sleep-and-count", params: { steps: 1, stepMs: 0 } })).status).toBe(401);
    as(people.viewer);
    const res = await post({ kind: "test-sleep-and-count", params: { steps: 1, stepMs: 0 } });
    expect(res.status).toBe(403);
    expect((await res.json()).error.details).toEqual({ action: "job:create" });
  });

  it("answers 400 naming the field for bad JSON, a bad kind or bad parameters", async () => {
    as(people.contributor);
    const badJson = await post("{ nope");
    expect(badJson.status).toBe(400);
    expect((await badJson.json()).error.field).toBe("body");
    const badKind = await post({ kind: "mystery", params: {} });
    expect(badKind.status).toBe(400);
    expect((await badKind.json()).error.field).toBe("kind");
    const badParams = await post({ kind: "test-sleep-and-count", params: { steps: 0, stepMs: 0 } });
    expect(badParams.status).toBe(400);
    expect((await badParams.json()).error.field).toBe("params.steps");
  });

  it("creates a job (201), shows it, lists it, and answers 429 beyond the per-user bound", async () => {
    as(people.contributor);
    const created = [];
    for (let i = 0; i < env.JOBS_PER_USER; i++) {
      const res = await post({ kind: "test-sleep-and-count", params: { steps: 2, stepMs: 1 } });
      expect(res.status).toBe(201);
      created.push(await res.json());
    }
    const over = await post({ kind: "test-sleep-and-count", params: { steps: 2, stepMs: 1 } });
    expect(over.status).toBe(429);
    expect((await over.json()).error.code).toBe("too_many_jobs");

    const one = await jobRoute.GET(new Request(`http://test/api/jobs/${created[0].id}`), idParams(created[0].id));
    expect(one.status).toBe(200);
    expect((await one.json()).status).toBe("queued");
    const list = await jobsRoute.GET(new Request("http://test/api/jobs?mine=1&limit=2"), noParams);
    const page = await list.json();
    expect(page.items).toHaveLength(2);
    expect(page.nextCursor).toEqual(expect.any(String));
    const missing = await jobRoute.GET(new Request("http://test/api/jobs/nope"), idParams("nope"));
    expect(missing.status).toBe(404);

    // Another contributor may not cancel it; the owner may.
    as(people.otherContributor);
    const refused = await cancelRoute.POST(new Request("http://test", { method: "POST", headers: { origin: "http://test" } }), idParams(created[0].id));
    expect(refused.status).toBe(403);
    as(people.contributor);
    const cancelled = await cancelRoute.POST(new Request("http://test", { method: "POST", headers: { origin: "http://test" } }), idParams(created[0].id));
    expect(cancelled.status).toBe(200);
    expect((await cancelled.json()).status).toBe("cancelled");
    expect((await post({ kind: "test-sleep-and-count", params: { steps: 2, stepMs: 1 } })).status).toBe(201);
  });

  it("runs what was queued through the API to completion", async () => {
    runner = createJobRunner({ db: t.db, computes: TEST_COMPUTES, workers: 2, pollMs: 100 });
    await runner.start();
    await runner.drain();
    as(people.contributor);
    const finished = await (await jobsRoute.GET(new Request("http://test/api/jobs?mine=1&status=succeeded"), noParams)).json();
    expect(finished.items).toHaveLength(env.JOBS_PER_USER);
    const res = await post({ kind: "test-sleep-and-count", params: { steps: 5, stepMs: 5 } });
    expect(res.status).toBe(201);
    const { id } = await res.json();
    const done = await waitFor(async () => (await jobRoute.GET(new Request("http://t"), idParams(id))).json(), (j) => j.status === "succeeded");
    expect(done.result).toEqual({ stopped: null, counted: 5, kept: 0 });
    expect(done.progress).toBe(1);
  });
});
