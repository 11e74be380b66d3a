/**
 * `npm run bench -- api [--quick] [--profile]`: the atlas API under load, on the real server.
 * Seeds the demo scenario (db/seed.ts) into a fresh libSQL file, adds 100,000 certified maps among
 * 20,000 models to the demo workspace, starts `next start` from the existing production build
 * (run `npx next build` first), and drives it with autocannon at 50 connections:
 *  - baseline: GET /api/health, a constant JSON route on the same server (no auth, no database);
 *  - a mix of the API's read endpoints (coarse-grains to/from, one map, one model, model list,
 *    search of maps and models, paths, chains, jobs, certificate schema) as the demo viewer, once
 *    with a personal API token and once with a session cookie;
 *  - the same baseline and mix against two `next start` processes on the same database (the
 *    deployment of `npm run demo:cluster`), the 50 connections split 25/25 across the two ports.
 * Prints requests/s, p50, p95, p99 and errors of each, and their ratios to the baseline. Target:
 * p95 < 50 ms and no errors on a quiet machine. --profile writes a V8 CPU profile of the server
 * (node --cpu-prof) and prints where its time went.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { createHash, randomBytes } from "node:crypto";
import { get as httpGet } from "node:http";
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { cpus, loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import autocannon from "autocannon";
import { encode } from "next-auth/jwt";
import { createDatabase } from "@/db/client";
import { migrateDatabase } from "@/db/migrate";
import { summariseCpuProfile } from "./cpu-profile";

const EDGES = 100_000;
const MODELS = 20_000;
const CONNECTIONS = 50;
const ROOT = new URL("../", import.meta.url).pathname;
const SESSION_COOKIE = "authjs.session-token";

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

function run(cmd: string, args: string[], env: Record<string, string>): Promise<void> {
  return new Promise((resolve, reject) => {
    const proc = spawn(cmd, args, { cwd: ROOT, env: { ...process.env, ...env }, stdio: ["ignore", "ignore", "inherit"] });
    proc.on("exit", (code) => (code === 0 ? resolve() : reject(new Error(`${cmd} ${args.join(" ")} exited with ${code}`))));
  });
}

/** The demo viewer of the seeded workspace, a token of theirs, and 100,000 maps in that workspace. */
export async function load(url: string) {
  const db = createDatabase(url);
  const c = db.$client;
  const viewer = (
    await c.execute(
      "SELECT u.id, u.email, u.name, m.workspace_id AS ws FROM users u JOIN memberships m ON m.user_id = u.id WHERE m.role = 'viewer' ORDER BY u.email LIMIT 1",
    )
  ).rows[0] as unknown as { id: string; email: string; name: string; ws: string };
  const ws = viewer.ws;
  const secret = `sqt_${randomBytes(32).toString("base64url")}`;
  await c.execute({
    sql: "INSERT INTO api_tokens (id, user_id, workspace_id, name, token_hash, prefix, role) VALUES ('bench-token', ?, ?, 'bench', ?, 'sqt_bench', 'viewer')",
    args: [viewer.id, ws, createHash("sha256").update(secret).digest("hex")],
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
  return { viewer, secret, modelIds };
}

/** The read endpoints of the mix, each with random ids. */
function readEndpoints(modelIds: string[], seed: number): (() => string)[] {
  const pick = random(seed);
  const model = () => modelIds[Math.floor(pick() * modelIds.length)];
  return [
    () => `/api/models/${model()}/maps?direction=${pick() < 0.5 ? "from" : "to"}&limit=50`,
    () => `/api/models/${model()}/maps?direction=from&limit=50`,
    () => `/api/maps/e${Math.floor(pick() * EDGES)}`,
    () => `/api/models/${model()}`,
    () => `/api/models?limit=20`,
    () => `/api/search?target=maps&q=Chain%20${Math.floor(pick() * 2000)}&limit=20`,
    () => `/api/search?target=models&q=Chain%20${Math.floor(pick() * 2000)}&limit=20`,
    () => `/api/paths?from=${model()}&to=${model()}&maxDepth=3`,
    () => `/api/chains?limit=20`,
    () => `/api/jobs?limit=20`,
    () => `/api/certificates/schema`,
  ];
}

/** The read mix: each request picks one endpoint at random. */
function readMix(modelIds: string[]): () => string {
  const pick = random(7);
  const endpoints = readEndpoints(modelIds, 8);
  return () => endpoints[Math.floor(pick() * endpoints.length)]();
}

/** One GET on a fresh connection (no keep-alive race with the server closing an idle socket). */
function getOnce(port: number, path: string, headers: Record<string, string>): Promise<void> {
  return new Promise((resolve, reject) => {
    const req = httpGet({ host: "127.0.0.1", port, path, headers, agent: false }, (res) => {
      res.resume();
      res.on("end", () => resolve());
    });
    req.on("error", reject);
  });
}

/** One connection, one request at a time: each endpoint's own latency (median and max of `n`). */
async function timeEachEndpoint(port: number, modelIds: string[], headers: Record<string, string>, n = 15): Promise<string> {
  const rows: string[] = [];
  for (const endpoint of readEndpoints(modelIds, 9)) {
    const ms: number[] = [];
    let example = "";
    for (let i = 0; i < n; i++) {
      example = endpoint();
      const t0 = performance.now();
      await getOnce(port, example, headers);
      ms.push(performance.now() - t0);
    }
    ms.sort((a, b) => a - b);
    rows.push(`  ${percentile(ms, 50).toFixed(1).padStart(7)} ms median, ${ms[ms.length - 1].toFixed(1).padStart(7)} ms max  ${example.replace(/[?].*$/, "?…")}`);
  }
  return rows.join("\n");
}

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? NaN;
}

type Load = { rps: number; p50: number; p95: number; p99: number; errors: number; total: number; detail: string; cpuPerRequest: number };

/**
 * CPU time (user + system) the server process has used, in ms, from /proc/<pid>/stat (fields 14 and
 * 15, in clock ticks of USER_HZ = 100 on Linux, proc(5)). Unlike latency it hardly moves when other
 * processes share the cores, so its ratio to the baseline is the steadier figure on a busy machine.
 */
function serverCpuMs(pid: number): number {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, "utf8");
    const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100;
  } catch {
    return NaN;
  }
}

/** One server process under load: its port and its pid (for its CPU time). */
type Target = { port: number; pid: number };

/**
 * Drives the targets at once for `seconds`, CONNECTIONS split evenly across them (25/25 for two),
 * the same request mix on each; latencies are pooled and CPU time is summed over the processes.
 */
async function hammer(targets: Target[], seconds: number, path: () => string, headers: Record<string, string> = {}): Promise<Load> {
  const latencies: number[] = [];
  let non2xx = 0;
  const statuses = new Map<number, number>();
  const instances = targets.map((t) => {
    const instance = autocannon({
      url: `http://127.0.0.1:${t.port}`,
      connections: CONNECTIONS / targets.length,
      duration: seconds,
      headers,
      requests: [{ method: "GET", setupRequest: (req) => ({ ...req, path: path() }) }],
    });
    instance.on("response", (_client: unknown, status: number, _bytes: number, ms: number) => {
      latencies.push(ms);
      if (status < 200 || status >= 300) non2xx++;
      statuses.set(status, (statuses.get(status) ?? 0) + 1);
    });
    return instance;
  });
  const cpuOf = () => targets.reduce((sum, t) => sum + serverCpuMs(t.pid), 0);
  const cpuBefore = cpuOf();
  const results = await Promise.all(instances);
  const cpuMs = cpuOf() - cpuBefore;
  const sorted = latencies.sort((a, b) => a - b);
  const sum = (f: (r: (typeof results)[number]) => number) => results.reduce((a, r) => a + f(r), 0);
  return {
    rps: sum((r) => r.requests.average),
    p50: percentile(sorted, 50),
    p95: percentile(sorted, 95),
    p99: percentile(sorted, 99),
    // autocannon counts timeouts among its errors.
    errors: sum((r) => r.errors) + non2xx,
    total: latencies.length,
    cpuPerRequest: cpuMs / Math.max(1, latencies.length),
    detail: `${sum((r) => r.timeouts)} timeouts, statuses ${JSON.stringify(Object.fromEntries(statuses))}`,
  };
}

async function freePort(): Promise<number> {
  const { freePort: find } = await import("@/tests/support/ports");
  return find();
}

async function startServer(url: string, secret: string, profileDir: string | null) {
  if (!existsSync(join(ROOT, ".next", "BUILD_ID"))) throw new Error("No production build in .next: run `npx next build` first.");
  const port = await freePort();
  const args = [...(profileDir ? ["--cpu-prof", `--cpu-prof-dir=${profileDir}`] : []), join(ROOT, "node_modules/next/dist/bin/next"), "start", "-p", String(port), "-H", "127.0.0.1"];
  const server: ChildProcess = spawn(process.execPath, args, {
    cwd: ROOT,
    detached: true,
    env: { ...process.env, NODE_ENV: "production", DATABASE_URL: url, AUTH_SECRET: secret, MAIL_CATCHER: "off", JOB_WORKERS: "0", NEXT_TELEMETRY_DISABLED: "1" },
    stdio: ["ignore", "ignore", "inherit"],
  });
  const deadline = Date.now() + 120_000;
  for (;;) {
    const ok = await fetch(`http://127.0.0.1:${port}/api/health`).then((r) => r.ok, () => false);
    if (ok) break;
    if (server.exitCode !== null || Date.now() > deadline) throw new Error("next start did not come up");
    await new Promise((r) => setTimeout(r, 250));
  }
  const exited = new Promise<void>((resolve) => server.once("exit", () => resolve()));
  // SIGINT lets node write the CPU profile on the way out.
  const stop = async () => {
    if (server.exitCode === null && server.pid) process.kill(-server.pid, "SIGINT");
    await Promise.race([exited, new Promise((r) => setTimeout(r, 60_000))]);
  };
  return { port, pid: server.pid ?? 0, stop };
}

function line(name: string, r: Load, base: Load | null): string {
  const ratio = base
    ? ` (${(r.rps / base.rps).toFixed(2)}× baseline req/s, p95 ${(r.p95 / base.p95).toFixed(1)}× baseline, server CPU ${(r.cpuPerRequest / base.cpuPerRequest).toFixed(1)}× baseline per request)`
    : "";
  const target = base ? `; target p95 < 50 ms: ${r.p95 < 50 ? "met" : "MISSED"}, errors 0: ${r.errors === 0 ? "met" : "MISSED"}` : "";
  return `${name}: ${r.rps.toFixed(0)} req/s, p50 ${r.p50.toFixed(1)} ms, p95 ${r.p95.toFixed(1)} ms, p99 ${r.p99.toFixed(1)} ms, errors ${r.errors} of ${r.total}, server CPU ${r.cpuPerRequest.toFixed(2)} ms/request${ratio}${target} [${r.detail}]`;
}

export async function main(args: string[]): Promise<void> {
  const quick = args.includes("--quick");
  const profile = args.includes("--profile");
  const seconds = quick ? 5 : 20;
  const dir = mkdtempSync(join(tmpdir(), "squarely-bench-api-"));
  const url = `file:${join(dir, "bench.db")}`;
  const authSecret = randomBytes(24).toString("hex");
  const profileDir = profile ? join(dir, "profile") : null;
  let server: Awaited<ReturnType<typeof startServer>> | null = null;
  let second: Awaited<ReturnType<typeof startServer>> | null = null;
  try {
    let t0 = performance.now();
    await migrateDatabase(url);
    await run(process.execPath, ["--conditions=react-server", "--import", "tsx", "db/seed.ts"], { DATABASE_URL: url, MAIL_CATCHER: "off" });
    console.log(`seeded the demo scenario in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
    t0 = performance.now();
    const { viewer, secret, modelIds } = await load(url);
    console.log(`loaded ${EDGES} maps among ${MODELS} models into the demo workspace in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
    const session = await encode({ token: { sub: viewer.id, email: viewer.email, name: viewer.name }, secret: authSecret, salt: SESSION_COOKIE });

    server = await startServer(url, authSecret, profileDir);
    const one: Target[] = [server];
    const mix = readMix(modelIds);
    const token = { authorization: `Bearer ${secret}` };
    const cookie = { cookie: `${SESSION_COOKIE}=${session}` };
    // Warm-up: JIT, route compilation and the page cache, for each way in.
    await hammer(one, 2, () => "/api/health");
    await hammer(one, 3, mix, token);
    await hammer(one, 3, mix, cookie);
    if (profile) console.log(`each endpoint alone (one connection, token):\n${await timeEachEndpoint(server.port, modelIds, token)}`);
    const base = await hammer(one, seconds, () => "/api/health");
    const viaToken = await hammer(one, seconds, mix, token);
    const viaSession = await hammer(one, seconds, mix, cookie);
    const oneLoad = loadavg();

    // The cluster deployment (npm run demo:cluster): a second `next start` on the same database file.
    second = await startServer(url, authSecret, null);
    const two: Target[] = [server, second];
    await hammer([second], 2, () => "/api/health");
    await hammer([second], 3, mix, token);
    await hammer([second], 3, mix, cookie);
    const twoBase = await hammer(two, seconds, () => "/api/health");
    const twoToken = await hammer(two, seconds, mix, token);
    const twoSession = await hammer(two, seconds, mix, cookie);
    const twoLoad = loadavg();
    await second.stop();
    second = null;

    const avg = (l: number[]) => l.map((x) => x.toFixed(2)).join(" ");
    console.log(`next start, demo database + ${EDGES} maps; autocannon ${CONNECTIONS} connections, ${seconds} s each; mix of 11 read endpoints`);
    console.log(`one process: load average ${avg(oneLoad)} on ${cpus().length} cores (other processes share them)`);
    console.log(line("baseline GET /api/health (constant JSON, same server)", base, null));
    console.log(line("API reads with a token", viaToken, base));
    console.log(line("API reads with a session", viaSession, base));
    console.log(`two processes (demo:cluster, same database, ${CONNECTIONS / 2}+${CONNECTIONS / 2} connections): load average ${avg(twoLoad)} on ${cpus().length} cores`);
    console.log(line("[2 processes] GET /api/health (constant JSON; ratios below are to the one-process baseline)", twoBase, null));
    console.log(line("[2 processes] API reads with a token", twoToken, base));
    console.log(line("[2 processes] API reads with a session", twoSession, base));
    await server.stop();
    server = null;
    if (profileDir) {
      const file = existsSync(profileDir) ? readdirSync(profileDir).find((f) => f.endsWith(".cpuprofile")) : undefined;
      console.log(file ? summariseCpuProfile(join(profileDir, file)) : "no CPU profile was written (the server did not exit in time)");
    }
  } finally {
    await second?.stop();
    await server?.stop();
    rmSync(dir, { recursive: true, force: true });
  }
}
