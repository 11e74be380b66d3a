// A process of the app's server side for the multi-process tests, run with
// `node --conditions=react-server --import tsx tests/support/job-node.ts <role>`:
//   app    — the JobQueue of JOB_QUEUE behind a small HTTP endpoint (POST /jobs), certified writes
//            (POST /certify: submitBuild, the path of POST /api/certificates), the watchers' mail
//            delivery (startMailDelivery, printing "mailed <Message-ID> <to>" per message sent), and
//            under the in-process queue this process's own job runner, as `next start` has;
//   worker — a BullMQ worker process (npm run jobs:worker) with the test job kind;
//   writer — certified writes one after another (submitBuild, the path of POST /api/certificates).
// It prints "ready <port>" when it serves, and one line per event the tests wait for.
import { createServer } from "node:http";
import { env } from "@/env";
import { getDatabase } from "@/db/queries/connection";
import { getJobQueue, requireRedisUrl } from "@/server/jobs";
import { startBullmqWorker } from "@/server/jobs/bullmq-worker";
import { createJobRunner } from "@/server/jobs/job-runner";
import { registerJobKind } from "@/server/jobs/kinds/registry";
import { defineJobKind } from "@/server/jobs/kinds/types";
import { submitBuild } from "@/server/atlas/submit";
import { startMailDelivery } from "@/server/mail/delivery";
import { sendMail, type OutgoingMail } from "@/server/mail/send";
import { SleepAndCountParams } from "@/tests/integration/jobs-sleep-kind";
import { TEST_COMPUTES } from "@/tests/integration/jobs-computes";
import { lumpableBuild } from "./lumpable-build";

registerJobKind(
  defineJobKind({ name: "test-sleep-and-count", title: "Count", paramsSchema: SleepAndCountParams, compute: "test-sleep-and-count", timeoutMs: 120_000 }),
);

const role = process.argv[2];
const db = getDatabase();
const jobOptions = { db, workers: Math.max(1, env.JOB_WORKERS), leaseMs: env.JOB_LEASE_MS, computes: TEST_COMPUTES, pollMs: 200 };

/** Mail through the configured SMTP server, each message sent named on stdout (the tests count them per process). */
async function sendAndSay(mail: OutgoingMail) {
  const sent = await sendMail(mail);
  console.log(`mailed ${mail.messageId} ${mail.to}`);
  return sent;
}

async function serveQueue(): Promise<void> {
  if (env.JOB_QUEUE === "in-process" && env.JOB_WORKERS > 0) {
    const runner = createJobRunner(jobOptions);
    await runner.start();
    console.log(`owner ${runner.owner}`);
  }
  startMailDelivery({ db, intervalMs: 500, send: sendAndSay });
  const queue = getJobQueue();
  const routes: Record<string, (input: Record<string, unknown>) => Promise<unknown>> = {
    "/jobs": (input) => queue.enqueue(input as Parameters<typeof queue.enqueue>[0]),
    "/certify": (input) => submitBuild(input as Parameters<typeof submitBuild>[0]),
  };
  const server = createServer((req, res) => {
    let body = "";
    req.on("data", (d) => (body += d));
    req.on("end", () => {
      const route = routes[req.url ?? ""];
      if (!route) return void res.writeHead(404).end();
      route(JSON.parse(body))
        .then((out) => res.writeHead(201, { "content-type": "application/json" }).end(JSON.stringify(out)))
        .catch((err) => res.writeHead(err.status ?? 500, { "content-type": "application/json" }).end(JSON.stringify({ error: String(err.message) })));
    });
  });
  server.listen(0, "127.0.0.1", () => {
    const address = server.address();
    console.log(`ready ${typeof address === "object" && address ? address.port : 0}`);
  });
}

async function work(): Promise<void> {
  const worker = await startBullmqWorker({ ...jobOptions, redisUrl: requireRedisUrl() });
  console.log(`owner ${worker.owner}`);
  console.log("ready 0");
}

/**
 * Certified writes through submitBuild; write number WRITER_PAUSE_AT stops for a minute inside its
 * transaction, after the map row and before the audit event and mail, and says "inside <i>": the
 * test kills it there.
 */
async function write(): Promise<void> {
  const workspaceId = process.env.WRITER_WORKSPACE ?? "";
  const userId = process.env.WRITER_USER ?? "";
  const pauseAt = Number(process.env.WRITER_PAUSE_AT ?? -1);
  console.log("ready 0");
  for (let i = 0; ; i++) {
    console.log(`begin ${i}`);
    const pause = async (step: string) => {
      if (step !== "map") return;
      console.log(`inside ${i}`);
      await new Promise((r) => setTimeout(r, 60_000));
    };
    const stored = await submitBuild({ workspaceId, userId, build: lumpableBuild(i), onStep: i === pauseAt ? pause : undefined });
    console.log(`ok ${i} ${stored.status}`);
  }
}

const roles: Record<string, () => Promise<void>> = { app: serveQueue, worker: work, writer: write };
(roles[role] ?? (() => Promise.reject(new Error(`unknown role "${role}"`))))().catch((err) => {
  console.error(err);
  process.exit(1);
});
