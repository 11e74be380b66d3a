/**
 * Export and import of the demo workspace (targets: under 10 s each), on a copy of a seeded demo
 * database: SQUARELY_BENCH_DB names one (e.g. a file made by `npm run db:seed`); without it the demo
 * is seeded into a temporary file first (a few minutes). Prints ratios against baselines measured in
 * the same run (see bench/bundle-run.ts).
 */
import { execFileSync, spawnSync } from "node:child_process";
import { copyFileSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

export async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), "squarely-bundle-bench-"));
  const file = join(dir, "demo.db");
  try {
    const given = process.env.SQUARELY_BENCH_DB?.replace(/^file:/, "");
    if (given) copyFileSync(given, file);
    else {
      const env = { ...process.env, DATABASE_URL: `file:${file}` };
      execFileSync("npm", ["run", "-s", "db:migrate"], { env, stdio: "inherit" });
      execFileSync("npm", ["run", "-s", "db:seed"], { env, stdio: "inherit" });
    }
    const run = spawnSync(process.execPath, ["--conditions=react-server", "--import", "tsx", "bench/bundle-run.ts", file], { stdio: "inherit", env: { ...process.env, DATABASE_URL: `file:${file}` } });
    if (run.status !== 0) throw new Error(`bundle-run exited ${run.status}`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
