import { readFileSync } from "node:fs";
import { join } from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { addWatchRule } from "@/db/queries/watches";
import { jobs, notificationOutbox, type Job } from "@/db/schema";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { startNode, type NodeProcess } from "@/tests/support/cluster";
import { freePort } from "@/tests/support/ports";
import { startRedis, type TestRedis } from "@/tests/support/redis";
import { lumpableBuild } from "@/tests/support/lumpable-build";
import { seedPeople, waitFor, type People } from "./jobs-fixtures";
import { startTestSmtp } from "./watch-smtp";

/** Short, so that a takeover is quick to test; the app's default is 30 s. */
const LEASE_MS = 4_000;
const JOB_COUNT = 100;
const MAP_COUNT = 100;

describe.each(["in-process", "bullmq"] as const)("two app processes on one database, %s queue", (mode) => {
  let t: TestDatabase;
  let redis: TestRedis | null = null;
  let apps: NodeProcess[] = [];
  let workers: NodeProcess[] = [];
  let smtp: Awaited<ReturnType<typeof startTestSmtp>>;
  let smtpPort: number;
  let ws: string;
  let owners: string[];
  let people: People;
  let env: Record<string, string>;
  /** Starts one more process of the kind that holds jobs under this queue: an app (in-process) or a worker (BullMQ). */
  let startHolder: () => Promise<NodeProcess>;
  const killed = new Set<NodeProcess>();

  beforeAll(async () => {
    t = await createTestDatabase();
    const seeded = await seedPeople(t.db);
    ws = seeded.workspace.id;
    people = seeded.people;
    owners = Object.values(seeded.people).map((p) => p.id);
    if (mode === "bullmq") redis = await startRedis();
    smtpPort = await freePort();
    smtp = await startTestSmtp(smtpPort);
    env = {
      DATABASE_URL: t.url,
      SMTP_HOST: "127.0.0.1",
      SMTP_PORT: String(smtpPort),
      JOB_QUEUE: mode,
      ...(redis ? { REDIS_URL: redis.url } : {}),
      JOB_LEASE_MS: String(LEASE_MS),
      JOBS_PER_USER: "100",
    };
    const appWorkers = mode === "in-process" ? "2" : "0";
    apps = await Promise.all([startNode("app", { ...env, JOB_WORKERS: appWorkers }), startNode("app", { ...env, JOB_WORKERS: appWorkers })]);
    if (mode === "bullmq") workers = await Promise.all([startNode("worker", { ...env, JOB_WORKERS: "2" }), startNode("worker", { ...env, JOB_WORKERS: "2" })]);
    startHolder = async () => {
      const node = await startNode(mode === "in-process" ? "app" : "worker", { ...env, JOB_WORKERS: "2" });
      (mode === "in-process" ? apps : workers).push(node);
      return node;
    };
  }, 240_000);

  afterAll(async () => {
    await Promise.all([...apps, ...workers].map((p) => p.stop()));
    await redis?.stop();
    await smtp?.close();
    t?.cleanup();
  });

  const rows = () => t.db.select().from(jobs);
  const row = async (id: string) => (await t.db.select().from(jobs).where(eq(jobs.id, id)))[0] as Job;
  const submit = async (app: NodeProcess, params: Record<string, unknown>, ownerId: string) => {
    const res = await fetch(`http://127.0.0.1:${app.port}/jobs`, {
      method: "POST",
      body: JSON.stringify({ workspaceId: ws, ownerId, kind: "test-sleep-and-count", params }),
    });
    expect(res.status).toBe(201);
    return (await res.json()) as { id: string };
  };

  it(`runs each of ${JOB_COUNT} jobs submitted through both processes exactly once`, { timeout: 300_000 }, async () => {
    const runLog = join(t.dir, "runs.log");
    const ids: string[] = [];
    for (let batch = 0; batch < JOB_COUNT; batch += 10) {
      const made = await Promise.all(
        Array.from({ length: 10 }, (_, k) => batch + k).map((i) =>
          submit(apps[i % 2], { steps: 1, stepMs: 5, runLog, mark: `job-${i}` }, owners[i % owners.length]),
        ),
      );
      ids.push(...made.map((j) => j.id));
    }
    const done = await waitFor(rows, (all) => all.length === JOB_COUNT && all.every((j) => j.status === "succeeded" || j.status === "failed"), 180_000);
    expect(new Set(ids).size).toBe(JOB_COUNT);
    expect(done.filter((j) => j.status === "succeeded")).toHaveLength(JOB_COUNT);
    expect(done.every((j) => j.attempts === 1)).toBe(true);
    const runs = readFileSync(runLog, "utf8").trim().split("\n").sort();
    expect(runs).toEqual(Array.from({ length: JOB_COUNT }, (_, i) => `job-${i}`).sort());
    const byRunner = new Map<string, number>();
    for (const j of done) byRunner.set(j.leaseOwner ?? "?", (byRunner.get(j.leaseOwner ?? "?") ?? 0) + 1);
    console.log(`${mode}: ${JOB_COUNT} jobs, each run once; jobs per runner: ${[...byRunner.values()].join(", ")}`);
  });

  it(`certifies ${MAP_COUNT} watched maps through both processes and mails each watcher once per map`, async () => {
    // Three watchers of every Markov chain; the two certifiers are never mailed about their own maps.
    const watchers = [people.viewer, people.curator, people.admin];
    for (const w of watchers) await addWatchRule({ db: t.db, workspaceId: ws, userId: w.id, scope: "class", modelKind: "markov" });
    const certifiers = [people.contributor.id, people.otherContributor.id];
    const mapIds: string[] = [];
    for (let batch = 0; batch < MAP_COUNT; batch += 10) {
      const made = await Promise.all(
        Array.from({ length: 10 }, (_, k) => batch + k).map(async (i) => {
          const res = await fetch(`http://127.0.0.1:${apps[i % 2].port}/certify`, {
            method: "POST",
            body: JSON.stringify({ workspaceId: ws, userId: certifiers[i % 2], build: lumpableBuild(1_000 + i) }),
          });
          expect(res.status).toBe(201);
          const stored = (await res.json()) as { status: string; mapId: string };
          expect(stored.status).toBe("created");
          return stored.mapId;
        }),
      );
      mapIds.push(...made);
    }
    expect(new Set(mapIds).size).toBe(MAP_COUNT);
    const expected = mapIds.flatMap((mapId) => watchers.map((w) => `${w.email} ${mapId}`)).sort();

    const outbox = await waitFor(
      () => t.db.select().from(notificationOutbox),
      (rows) => rows.length === expected.length && rows.every((r) => r.status === "sent"),
      180_000,
    );
    // Several more delivery passes of both processes (every 500 ms): a second copy would come now.
    await new Promise((r) => setTimeout(r, 3_000));
    const byMessageId = new Map(outbox.map((row) => [`<outbox.${row.id}@localhost>`, row]));
    const got = smtp.received.map((m) => {
      const mapId = mapIds.find((id) => m.text.includes(`/atlas/maps/${id}`)) ?? "?";
      expect(byMessageId.get(m.messageId ?? "")?.mapId).toBe(mapId);
      expect(m.to).toHaveLength(1);
      return `${m.to[0]} ${mapId}`;
    });
    expect(got.sort()).toEqual(expected);
    expect(new Set(smtp.received.map((m) => m.messageId)).size).toBe(expected.length);

    // Both processes delivered: the claims split the outbox between them rather than one doing it all.
    const mailedBy = apps.map((app) => (app.output().match(/^mailed /gm) ?? []).length);
    expect(mailedBy.reduce((a, b) => a + b, 0)).toBe(expected.length);
    expect(mailedBy.every((n) => n > 0)).toBe(true);
    console.log(`${mode}: ${MAP_COUNT} maps certified through two processes, ${expected.length} mails each received once; sent per process: ${mailedBy.join(", ")}`);
  }, 360_000);

  it("takes over (or fails with a reason) a job whose worker was killed with SIGKILL mid-job; it is never lost", async () => {
    const runLog = join(t.dir, "long.log");
    const job = await submit(apps[0], { steps: 100, stepMs: 100, runLog, mark: "long" }, owners[0]);
    const running = await waitFor(() => row(job.id), (j) => j.status === "running" && j.progress > 0.05, 60_000);
    const holders = mode === "in-process" ? apps : workers;
    const holder = holders.find((p) => p.owner === running.leaseOwner);
    expect(holder).toBeDefined();
    const killedAt = Date.now();
    await holder!.killHard();
    killed.add(holder!);

    const finished = await waitFor(() => row(job.id), (j) => j.status !== "queued" && j.status !== "running", 120_000);
    const takeoverMs = finished.startedAt ? finished.startedAt.getTime() - killedAt : NaN;
    console.log(`${mode}: killed job ended ${finished.status} after attempt ${finished.attempts}; taken over ${takeoverMs} ms after the kill (lease ${LEASE_MS} ms)`);
    if (finished.status === "succeeded") {
      expect(finished.attempts).toBe(2);
      expect(finished.leaseOwner).not.toBe(running.leaseOwner);
      // The second run began only after the first runner was dead and its lease had lapsed.
      expect(takeoverMs).toBeGreaterThan(0);
      expect(readFileSync(runLog, "utf8").trim().split("\n")).toEqual(["long", "long"]);
      expect(finished.result).toBe(JSON.stringify({ stopped: null, counted: 100, kept: 0 }));
    } else {
      expect(finished.status).toBe("failed");
      expect(finished.error).toMatch(/worker stopped \d+ times/);
    }
  });

  it("fails with the reason, never loses, a job whose runner is killed (SIGKILL) twice", async () => {
    // Two live holders: the one the last test killed is replaced.
    while ((mode === "in-process" ? apps : workers).filter((p) => !killed.has(p)).length < 2) await startHolder();
    const holders = () => (mode === "in-process" ? apps : workers).filter((p) => !killed.has(p));
    const via = apps.find((p) => !killed.has(p))!;
    const runLog = join(t.dir, "twice.log");
    const job = await submit(via, { steps: 300, stepMs: 100, runLog, mark: "twice" }, owners[1]);
    const first = await waitFor(() => row(job.id), (j) => j.status === "running" && j.progress > 0.02, 60_000);
    const firstHolder = holders().find((p) => p.owner === first.leaseOwner)!;
    await firstHolder.killHard();
    killed.add(firstHolder);
    const second = await waitFor(() => row(job.id), (j) => j.status === "running" && j.attempts === 2 && j.progress > 0.02, 120_000);
    const secondHolder = holders().find((p) => p.owner === second.leaseOwner)!;
    expect(secondHolder).toBeDefined();
    await secondHolder.killHard();
    killed.add(secondHolder);
    // Nobody holds jobs now; the next process to start finds the job's lease lapsed and its attempts spent.
    const killedAt = Date.now();
    await startHolder();
    const finished = await waitFor(() => row(job.id), (j) => j.status !== "queued" && j.status !== "running", 120_000);
    console.log(`${mode}: a job whose runner was killed twice ended ${finished.status} ${finished.finishedAt!.getTime() - killedAt} ms after the second kill: ${finished.error}`);
    expect(finished.status).toBe("failed");
    expect(finished.attempts).toBe(2);
    expect(finished.error).toBe("its worker stopped 2 times before the job finished (lease expired); not retried again");
    expect(readFileSync(runLog, "utf8").trim().split("\n")).toEqual(["twice", "twice"]);
  }, 360_000);
});
