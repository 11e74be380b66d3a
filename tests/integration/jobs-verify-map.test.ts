import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { certificates, maps } from "@/db/schema";
import { buildRequestRefusal, DEFAULT_LIMITS } from "@/lib/verify";
import type { TestDatabase } from "@/tests/support/database";
import type { JobRunner } from "@/server/jobs/job-runner";
import type { JobQueue } from "@/server/jobs/queue";
import { closeJobKindTestbed, openJobKindTestbed, type People } from "./jobs-fixtures";

let t: TestDatabase;
let queue: JobQueue;
let runner: JobRunner;
let ws: string;
let people: People;

beforeAll(async () => {
  ({ t, queue, runner, ws, people } = await openJobKindTestbed());
});

afterAll(() => closeJobKindTestbed({ t, runner }));

async function run(build: unknown) {
  const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "verify-map", params: { build } });
  await runner.drain();
  return (await queue.get({ jobId: job.id, workspaceId: ws }))!;
}

describe("the verify-map job", () => {
  it("checks a map past a request's window bound with the job's bounds and stores it", async () => {
    // Block 5 over 10 steps of a radius-1 rule reads 2 blocks either side (R = ⌈10/5⌉, DOMAIN.md §2b): 2^25 windows,
    // past a request's 2^24 but within a job's 2^28. Rule 204 is the identity (Wolfram code: bit 4a+2b+c of 204 is b),
    // so keeping the first cell of each block commutes, and the coarse rule is the identity of radius 2.
    const build = { kind: "projection", rule: 204, block: 5, steps: 10, projection: Array.from({ length: 32 }, (_, s) => s >> 4) };
    expect(buildRequestRefusal(build, DEFAULT_LIMITS)).toMatchObject({ status: "too-large", bound: "maxWindows" });
    const done = await run(build);
    expect(done.error).toBeNull();
    expect(done.status).toBe("succeeded");
    const result = done.result as { ok: boolean; mapId: string; address: string };
    expect(result.ok).toBe(true);
    const [map] = await t.db.select().from(maps).where(eq(maps.id, result.mapId));
    expect(map).toMatchObject({ kind: "projection", block: 5, certificateAddress: result.address });
    const [cert] = await t.db.select().from(certificates).where(eq(certificates.address, result.address));
    const target = JSON.parse(cert.body).target as { k: number; r: number; table: number[] };
    expect(target).toMatchObject({ k: 2, r: 2 });
    // Index of a 5-cell window with x_{-2} most significant (DOMAIN.md §1): the centre cell is bit 2.
    expect(target.table).toEqual(Array.from({ length: 32 }, (_, i) => (i >> 2) & 1));
  }, 180_000);

  it("ends with the counterexample when the square does not commute, and stores nothing", async () => {
    const before = (await t.db.select().from(maps)).length;
    const done = await run({ kind: "projection", rule: 110, block: 2, projection: [0, 0, 0, 1] });
    expect(done.status).toBe("succeeded");
    expect(done.result).toMatchObject({ ok: false, counterexample: { kind: "not-a-function" } });
    expect((await t.db.select().from(maps)).length).toBe(before);
  }, 60_000);
});
