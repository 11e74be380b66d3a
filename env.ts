import { z } from "zod";

/**
 * The environment, read once and validated. Everything has an embedded default so that a fresh
 * clone runs with no configuration; production sets the secrets and the SMTP host.
 */
const EnvSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z.string().min(1).default("file:data/squarely.db"),
  DATABASE_AUTH_TOKEN: z.string().optional(),
  AUTH_SECRET: z.string().min(16).default("squarely-local-development-secret-change-me"),
  APP_URL: z.string().url().default("http://localhost:3000"),
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().positive().default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  SMTP_SECURE: z.enum(["true", "false"]).default("false").transform((v) => v === "true"),
  MAIL_FROM: z.string().default("Squarely <atlas@squarely.local>"),
  /** Start the local SMTP catcher inside the app process (demo, development and tests). */
  MAIL_CATCHER: z.enum(["on", "off"]).default("on"),
  /**
   * Operators who may read the catcher's page /dev/mail: a comma-separated list of e-mail addresses.
   * Deliberately not a workspace role: anyone who signs up is admin of a workspace of their own, and
   * the catcher holds every message of the installation, sign-in links included. Empty: nobody.
   */
  MAIL_OPERATORS: z
    .string()
    .default("")
    .transform((v) =>
      v
        .split(",")
        .map((e) => e.trim().toLowerCase())
        .filter((e) => e.length > 0),
    ),
  /** Where the catcher keeps caught messages (one JSON file each) for the /dev/mail page and tests. */
  MAIL_CATCHER_DIR: z.string().min(1).default("data/mail"),
  /** Worker threads that run background jobs inside the app process. */
  JOB_WORKERS: z.coerce.number().int().min(0).max(16).default(2),
  /** Where jobs are queued: the jobs table, run by each app process's own workers; or BullMQ over Redis, run by `npm run jobs:worker` processes. */
  JOB_QUEUE: z.enum(["in-process", "bullmq"]).default("in-process"),
  /** Redis for JOB_QUEUE=bullmq (redis://host:port). */
  REDIS_URL: z.string().url().optional(),
  /** How long a job's claim holds without its runner's heartbeat; a dead runner's job is taken over after it. */
  JOB_LEASE_MS: z.coerce.number().int().min(1_000).max(600_000).default(30_000),
  /** Jobs one user may have running or queued at once. */
  JOBS_PER_USER: z.coerce.number().int().min(1).max(100).default(4),
  /** Time bound of one server-side certificate check (the worker thread is terminated after it). */
  VERIFY_TIMEOUT_MS: z.coerce.number().int().min(100).max(600_000).default(20_000),
  /** V8 heap bound of a verification worker thread, in MB. */
  VERIFY_MEMORY_MB: z.coerce.number().int().min(32).max(8192).default(512),
});

export type Env = z.infer<typeof EnvSchema>;

function readEnv(): Env {
  const parsed = EnvSchema.safeParse(process.env);
  if (!parsed.success) {
    const fields = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
    throw new Error(`Invalid environment: ${fields}`);
  }
  return parsed.data;
}

export const env: Env = readEnv();
