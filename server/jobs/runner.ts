import { env } from "@/env";
import { getDatabase } from "@/db/queries/connection";
import { startMailDelivery } from "@/server/mail/delivery";
import type { OutboxDelivery } from "@/server/mail/outbox";
import { createJobRunner, type JobRunner } from "./job-runner";
import "./kinds";

type Started = { runner: JobRunner | null; outbox: OutboxDelivery };
const globalForRunner = globalThis as unknown as { squarelyJobRunner?: Promise<Started> };

/**
 * Starts this process's job runner (when JOB_WORKERS > 0) and the watchers' mail delivery, once per
 * process. Called from instrumentation.ts in the Node.js runtime only: worker threads and SMTP do
 * not exist in the edge runtime.
 */
export function startJobRunner(): Promise<Started | null> {
  if (process.env.NEXT_RUNTIME && process.env.NEXT_RUNTIME !== "nodejs") return Promise.resolve(null);
  globalForRunner.squarelyJobRunner ??= start();
  return globalForRunner.squarelyJobRunner;
}

async function start(): Promise<Started> {
  const db = getDatabase();
  let runner: JobRunner | null = null;
  // Under BullMQ the jobs run in separate worker processes (npm run jobs:worker), not here.
  if (env.JOB_WORKERS > 0 && env.JOB_QUEUE === "in-process") {
    runner = createJobRunner({ db, workers: env.JOB_WORKERS, leaseMs: env.JOB_LEASE_MS });
    await runner.start();
  }
  const outbox = startMailDelivery({ db });
  const jobs = runner ? `${env.JOB_WORKERS} job worker thread(s)` : env.JOB_QUEUE === "bullmq" ? "jobs on BullMQ (worker processes)" : "no job workers";
  console.log(`job runner: ${jobs}; mail outbox delivery started`);
  return { runner, outbox };
}
