/**
 * `npm run bench -- api [--quick]`: the atlas API under load. Loads 100,000 certified maps among
 * 20,000 models into a fresh libSQL file, then
 *  - autocannon, 50 connections on localhost for 20 s (3 s with --quick), against the
 *    "coarse-grains to/from" read GET /api/models/{id}/maps (random model, random direction, Bearer
 *    token): requests/s, p95 latency, errors — against a constant-JSON baseline on the same server;
 *  - depth-4 path queries (recursive CTE) between random pairs, against a point lookup.
 * The handler runs in a plain node http server (a child process), not under `next start`: building
 * the app inside a benchmark is impractical on a shared machine. Targets: p95 < 50 ms, no errors,
 * depth-4 path < 200 ms.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { createHash, randomBytes } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import autocannon from "autocannon";
import { createDatabase } from "@/db/client";
import { migrateDatabase } from "@/db/migrate";

const EDGES = 100_000;
const MODELS = 20_000;
const CONNECTIONS = 50;

/** mulberry32 (common practice): a reproducible graph. */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export async function load(url: string) {
  const db = createDatabase(url);
  const c = db.$client;
  const ws = "bench-ws";
  const user = "bench-user";
  await c.execute({ sql: "INSERT INTO workspaces (id, slug, name) VALUES (?, 'bench', 'Bench')", args: [ws] });
  await c.execute({ sql: "INSERT INTO users (id, email, name) VALUES (?, 'bench@bench.test', 'Bench')", args: [user] });
  await c.execute({ sql: "INSERT INTO memberships (workspace_id, user_id, role) VALUES (?, ?, 'viewer')", args: [ws, user] });
  const secret = `sqt_${randomBytes(32).toString("base64url")}`;
  await c.execute({
    sql: "INSERT INTO api_tokens (id, user_id, workspace_id, name, token_hash, prefix, role) VALUES ('bench-token', ?, ?, 'bench', ?, 'sqt_bench', 'viewer')",
    args: [user, ws, createHash("sha256").update(secret).digest("hex")],
  });
  const modelIds = Array.from({ length: MODELS }, (_, i) => `m${i}`);
  // Rows are generated inside SQLite (a recursive counter): 300,000 inserts in a few statements.
  // The addresses are distinct stand-ins, not hashes: nothing here is verified, only read.
  await c.execute({
    sql: `INSERT INTO models (id, workspace_id, address, kind, name, canonical, states)
          WITH RECURSIVE n(i) AS (SELECT 0 UNION ALL SELECT i + 1 FROM n WHERE i + 1 < ?)
          SELECT 'm' || i, ?, 'sha256:' || printf('%064d', i), 'markov', 'Chain ' || i,
                 '{"kind":"markov","labels":["a","b"],"matrix":[["1","0"],["0","1"]]}', 2 FROM n`,
    args: [MODELS, ws],
  });
  const next = random(42);
  const ends = Array.from({ length: EDGES }, () => {
    const from = Math.floor(next() * MODELS);
    const to = Math.floor(next() * MODELS);
    return [from, to === from ? (to + 1) % MODELS : to];
  });
  await c.execute({ sql: "CREATE TEMP TABLE ends (i INTEGER PRIMARY KEY, s INTEGER, t INTEGER)" });
  for (let start = 0; start < EDGES; start += 5000) {
    const chunk = ends.slice(start, start + 5000);
    await c.execute({
      sql: `INSERT INTO ends (i, s, t) SELECT key + ?, json_extract(value, '$[0]'), json_extract(value, '$[1]') FROM json_each(?)`,
      args: [start, JSON.stringify(chunk)],
    });
  }
  const kinds = `CASE i % 4 WHEN 0 THEN 'lumping' WHEN 1 THEN 'decimation' WHEN 2 THEN 'projection' ELSE 'blocking' END`;
  await c.execute({
    sql: `INSERT INTO certificates (address, kind, format_version, body, checker_version, verified_at)
          SELECT 'sha256:e' || printf('%063d', i), ${kinds}, 1, '{}', 'bench', ? FROM ends`,
    args: [Date.now()],
  });
  await c.execute({
    sql: `INSERT INTO maps (id, workspace_id, source_model_id, target_model_id, kind, block, steps, summary, certificate_address)
          SELECT 'e' || i, ?, 'm' || s, 'm' || t, ${kinds}, 2 + i % 3, 2, 'Chain ' || s || ' → Chain ' || t,
                 'sha256:e' || printf('%063d', i) FROM ends`,
    args: [ws],
  });
  await c.execute("ANALYZE");
  c.close();
  return { ws, secret, modelIds };
}

function child(args: string[], url: string): ChildProcess {
  return spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "bench/api-server.ts", ...args], {
    env: { ...process.env, DATABASE_URL: url, NODE_ENV: "production", MAIL_CATCHER: "off" },
    stdio: ["ignore", "pipe", "inherit"],
  });
}

function firstJson(proc: ChildProcess): Promise<Record<string, unknown>> {
  return new Promise((resolve, reject) => {
    let buffer = "";
    proc.stdout!.on("data", (chunk: Buffer) => {
      buffer += chunk.toString();
      const line = buffer.split("\n").find((l) => l.trim().startsWith("{"));
      if (line) resolve(JSON.parse(line) as Record<string, unknown>);
    });
    proc.on("exit", (code) => reject(new Error(`child exited with ${code}`)));
  });
}

function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? NaN;
}

async function hammer(port: number, seconds: number, path: () => string, token?: string) {
  const latencies: number[] = [];
  let non2xx = 0;
  const statuses = new Map<number, number>();
  const instance = autocannon({
    url: `http://127.0.0.1:${port}`,
    connections: CONNECTIONS,
    duration: seconds,
    headers: token ? { authorization: `Bearer ${token}` } : {},
    requests: [{ method: "GET", setupRequest: (req) => ({ ...req, path: path() }) }],
  });
  instance.on("response", (_client: unknown, status: number, _bytes: number, ms: number) => {
    latencies.push(ms);
    if (status < 200 || status >= 300) non2xx++;
    statuses.set(status, (statuses.get(status) ?? 0) + 1);
  });
  const result = await instance;
  return {
    rps: result.requests.average,
    p95: percentile(latencies, 95),
    // autocannon counts timeouts among its errors.
    errors: result.errors + non2xx,
    total: latencies.length,
    detail: `${result.timeouts} timeouts, ${result.errors - result.timeouts} connection errors, statuses ${JSON.stringify(Object.fromEntries(statuses))}`,
  };
}

export async function main(args: string[]): Promise<void> {
  const quick = args.includes("--quick");
  const seconds = quick ? 3 : 20;
  const dir = mkdtempSync(join(tmpdir(), "squarely-bench-api-"));
  const url = `file:${join(dir, "bench.db")}`;
  const procs: ChildProcess[] = [];
  try {
    await migrateDatabase(url);
    let t0 = performance.now();
    const { ws, secret, modelIds } = await load(url);
    console.log(`loaded ${EDGES} maps among ${MODELS} models in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

    const port = 40_000 + Math.floor(Math.random() * 10_000);
    const server = child(["serve", String(port)], url);
    procs.push(server);
    await firstJson(server);
    const pick = random(7);
    const randomRead = () =>
      `/api/models/${modelIds[Math.floor(pick() * MODELS)]}/maps?direction=${pick() < 0.5 ? "from" : "to"}&limit=50`;
    const base = await hammer(port, seconds, () => "/baseline");
    await hammer(port, 2, randomRead, secret); // warm-up: JIT and page cache
    await new Promise((r) => setTimeout(r, 500)); // let the warm-up's last requests drain
    const read = await hammer(port, seconds, randomRead, secret);
    console.log(
      `note: handler served by a plain node http server in a child process (not next start); autocannon ${CONNECTIONS} connections, ${seconds} s each`,
    );
    console.log(
      `baseline (constant JSON, same server): ${base.rps.toFixed(0)} req/s, p95 ${base.p95.toFixed(1)} ms, errors ${base.errors}`,
    );
    console.log(
      `coarse-grains to/from GET /api/models/{id}/maps: ${read.rps.toFixed(0)} req/s (${(read.rps / base.rps).toFixed(2)}× baseline), p95 ${read.p95.toFixed(1)} ms (target < 50 ms: ${read.p95 < 50 ? "met" : "MISSED"}), errors ${read.errors} of ${read.total} (target 0: ${read.errors === 0 ? "met" : "MISSED"}; ${read.detail})`,
    );
    server.kill();

    const pairs: [string, string][] = Array.from({ length: 30 }, () => [
      modelIds[Math.floor(pick() * MODELS)],
      modelIds[Math.floor(pick() * MODELS)],
    ]);
    t0 = performance.now();
    const timer = child(["paths", JSON.stringify(pairs), ws], url);
    procs.push(timer);
    const timed = (await firstJson(timer)) as { point: number[]; depth4: number[]; found: number[] };
    const median = percentile(timed.depth4, 50);
    const worst = Math.max(...timed.depth4);
    const pointMedian = percentile(timed.point, 50);
    console.log(
      `depth-4 path query (${pairs.length} random pairs, ${timed.found.filter((n) => n > 0).length} connected): median ${median.toFixed(1)} ms, p95 ${percentile(timed.depth4, 95).toFixed(1)} ms, max ${worst.toFixed(1)} ms (${(median / pointMedian).toFixed(0)}× a point lookup of ${pointMedian.toFixed(2)} ms; target < 200 ms: ${worst < 200 ? "met" : "MISSED"})`,
    );
  } finally {
    for (const p of procs) if (p.exitCode === null) p.kill();
    rmSync(dir, { recursive: true, force: true });
  }
}
