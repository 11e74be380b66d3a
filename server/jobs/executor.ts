import { randomUUID } from "node:crypto";
import { hostname } from "node:os";
import type { Database } from "@/db/client";
import type { Job } from "@/db/schema";
import { finishJob, listCancelRequested, renewJobLeases, updateJobProgress } from "@/db/queries/jobs";
import { isAppError } from "@/server/errors";
import { getJobKind } from "./kinds/registry";
import type { JobKind } from "./kinds/types";
import { createWorkerPool, type TaskOutcome, type WorkerPool } from "./pool";

const PROGRESS_WRITE_MS = 250;
/** @default lease of a running job: renewed every third of it, so two missed beats are survived. */
export const DEFAULT_LEASE_MS = 30_000;

export type JobExecutorOptions = {
  db: Database;
  /** Worker threads. */
  workers: number;
  /** Per-job memory bound in MB. @default 512 */
  memoryMb?: number;
  /** Time given to a cancelled computation to stop by itself before its thread is terminated. @default 3000 */
  graceMs?: number;
  /** File URL of a COMPUTES table other than the product's (tests register kinds of their own). */
  computes?: string;
  /** How long a claim holds without a heartbeat. @default 30000 */
  leaseMs?: number;
  /** How often leases are renewed and cancel requests read. @default min(1000, leaseMs / 3) */
  heartbeatMs?: number;
};

export type JobExecutor = {
  /** Process-unique name written as the lease owner of every job this executor claims. */
  owner: string;
  leaseMs: number;
  /** Runs a job that this executor's owner has claimed; resolves when the row is finished (or the lease lost). */
  run(job: Job): Promise<void>;
  running(): Job[];
  /** Renews the leases held, stops jobs whose lease was lost or whose cancel was asked. */
  heartbeat(): Promise<void>;
  /** Waits for running jobs, stops the heartbeat and ends the worker threads. */
  stop(): Promise<void>;
};

type Running = { job: Job; cancel: AbortController; lost: boolean; done: Promise<void> };

/**
 * Runs claimed jobs in a pool of worker threads while holding their leases: the in-process runner
 * and the BullMQ worker both hand it the jobs they claim. Every write to a running job is fenced by
 * the lease owner, so a runner that stalled past its lease (and was taken over) writes nothing.
 */
export function createJobExecutor(options: JobExecutorOptions): JobExecutor {
  const { db } = options;
  const owner = `${hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`;
  const leaseMs = options.leaseMs ?? DEFAULT_LEASE_MS;
  const pool: WorkerPool = createWorkerPool({ workers: Math.max(1, options.workers), memoryMb: options.memoryMb });
  const running = new Map<string, Running>();
  let beating: Promise<void> | null = null;
  const timer = setInterval(
    () => void heartbeat().catch((err) => console.error("job heartbeat:", err)),
    options.heartbeatMs ?? Math.min(1000, Math.floor(leaseMs / 3)),
  );
  timer.unref();

  function heartbeat(): Promise<void> {
    beating ??= beat().finally(() => {
      beating = null;
    });
    return beating;
  }

  async function beat(): Promise<void> {
    const ids = [...running.keys()];
    if (ids.length === 0) return;
    const held = new Set(await renewJobLeases({ db, ids, owner, leaseMs }));
    for (const id of ids) {
      const entry = running.get(id);
      if (entry && !held.has(id)) {
        entry.lost = true;
        entry.cancel.abort();
      }
    }
    for (const id of await listCancelRequested({ db, ids: [...held] })) running.get(id)?.cancel.abort();
  }

  function run(job: Job): Promise<void> {
    const entry: Running = { job, cancel: new AbortController(), lost: false, done: Promise.resolve() };
    entry.done = execute(entry).finally(() => running.delete(job.id));
    running.set(job.id, entry);
    return entry.done;
  }

  async function execute(entry: Running): Promise<void> {
    const { job } = entry;
    const finish = (input: Omit<Parameters<typeof finishJob>[0], "db" | "id" | "owner">) =>
      finishJob({ db, id: job.id, owner, ...input });
    try {
      const kind = getJobKind(job.kind);
      if (!kind) {
        await finish({ status: "failed", error: `unknown job kind "${job.kind}"` });
        return;
      }
      const parsed = kind.paramsSchema.safeParse(JSON.parse(job.params));
      if (!parsed.success) {
        await finish({ status: "failed", error: `invalid parameters: ${parsed.error.issues[0].message}` });
        return;
      }
      await runKind(entry, kind, parsed.data, finish);
    } catch (err) {
      if (!isAppError(err)) console.error(`job ${job.id} (${job.kind}) failed:`, err);
      await finish({ status: "failed", error: publicMessage(err), result: failureDetails(err) }).catch(() => undefined);
    }
  }

  async function runKind(
    entry: Running,
    kind: JobKind<unknown>,
    params: unknown,
    finish: (input: Omit<Parameters<typeof finishJob>[0], "db" | "id" | "owner">) => Promise<unknown>,
  ): Promise<void> {
    const { job, cancel } = entry;
    const share = kind.persist ? (kind.computeShare ?? 0.5) : 1;
    const progress = progressWriter(db, job.id, owner);
    const outcome: TaskOutcome = await pool.run({
      compute: kind.compute,
      computes: options.computes,
      params,
      timeoutMs: kind.timeoutMs,
      cancel: cancel.signal,
      graceMs: options.graceMs,
      onProgress: (fraction, item) => progress.report(fraction * share, item),
    });
    await progress.flush();
    // Taken over by another runner: whatever this one found is not written.
    if (entry.lost) return;
    if (outcome.status === "timeout") {
      await finish({ status: "failed", error: `stopped: exceeded its time bound of ${formatMs(outcome.timeoutMs)}` });
      return;
    }
    if (outcome.status === "error") {
      await finish({ status: "failed", error: outcome.message });
      return;
    }
    if (outcome.status === "cancelled") {
      await finish({ status: "cancelled", error: "cancelled on request", result: outcome.output ?? undefined });
      return;
    }
    let result = outcome.output;
    if (kind.persist) {
      result = await kind.persist({
        db,
        job,
        params,
        output: outcome.output,
        signal: cancel.signal,
        onProgress: (fraction, item) => progress.report(share + fraction * (1 - share), item),
      });
      await progress.flush();
      if (entry.lost) return;
      if (cancel.signal.aborted) {
        await finish({ status: "cancelled", error: "cancelled on request while saving results", result });
        return;
      }
    }
    await finish({ status: "succeeded", result, progress: 1 });
  }

  return {
    owner,
    leaseMs,
    run,
    running: () => [...running.values()].map((r) => r.job),
    heartbeat,
    async stop() {
      await Promise.all([...running.values()].map((r) => r.done));
      clearInterval(timer);
      await beating;
      await pool.destroy();
    },
  };
}

/** Progress writes at most every PROGRESS_WRITE_MS, in order, with the latest value kept. */
function progressWriter(db: Database, id: string, owner: string) {
  let pending: { fraction: number; item: string | null } | null = null;
  let last = 0;
  let chain: Promise<void> = Promise.resolve();
  let timer: NodeJS.Timeout | undefined;
  const write = () => {
    timer = undefined;
    if (!pending) return;
    const { fraction, item } = pending;
    pending = null;
    last = Date.now();
    chain = chain.then(() => updateJobProgress({ db, id, owner, progress: fraction, currentItem: item })).catch(() => undefined);
  };
  return {
    report(fraction: number, item: string | null) {
      pending = { fraction, item };
      if (timer) return;
      timer = setTimeout(write, Math.max(0, PROGRESS_WRITE_MS - (Date.now() - last)));
    },
    async flush() {
      clearTimeout(timer);
      write();
      await chain;
    },
  };
}

/**
 * What a failed check found, kept as the job's result so that its page can draw it: a kind that throws
 * an AppError whose details carry a counterexample (verify-chain) keeps those details; others keep none.
 */
function failureDetails(err: unknown): unknown {
  if (!isAppError(err) || !err.details || typeof err.details !== "object") return undefined;
  return "counterexample" in err.details && err.details.counterexample ? err.details : undefined;
}

function publicMessage(err: unknown): string {
  if (isAppError(err)) return err.message;
  return "the job stopped on an unexpected error; see the server log";
}

function formatMs(ms: number): string {
  return ms % 1000 === 0 ? `${ms / 1000} s` : `${ms} ms`;
}
