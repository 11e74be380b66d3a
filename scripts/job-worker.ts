// A job worker process for JOB_QUEUE=bullmq: runs the product's job kinds from BullMQ over Redis
// (REDIS_URL) against the app's database, with JOB_WORKERS threads. `npm run jobs:worker`.
import { env } from "@/env";
import { getDatabase } from "@/db/queries/connection";
import { requireRedisUrl } from "@/server/jobs";
import { startBullmqWorker } from "@/server/jobs/bullmq-worker";

const STOP_WITHIN_MS = 10_000;

async function main(): Promise<void> {
  const worker = await startBullmqWorker({
    db: getDatabase(),
    redisUrl: requireRedisUrl(),
    workers: Math.max(1, env.JOB_WORKERS),
    leaseMs: env.JOB_LEASE_MS,
  });
  console.log(`job worker ${worker.owner}: ${Math.max(1, env.JOB_WORKERS)} thread(s) on BullMQ at ${env.REDIS_URL}`);
  // A stop waits for running jobs, but not for ever (nor for a Redis that is gone): what is still
  // running then is taken over by another worker once its lease runs out.
  const stop = async () => {
    setTimeout(() => process.exit(1), STOP_WITHIN_MS).unref();
    await worker.close();
    process.exit(0);
  };
  process.once("SIGTERM", () => void stop());
  process.once("SIGINT", () => void stop());
}

main().catch((err) => {
  console.error("job worker:", err);
  process.exit(1);
});
