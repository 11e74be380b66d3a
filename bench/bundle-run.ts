/**
 *   node --conditions=react-server --import tsx bench/bundle-run.ts <database file>
 * Run by bench/bundle.bench.ts on a copy of a seeded demo database (the query layer needs the
 * react-server condition). Exports the demo workspace, imports it into a new empty workspace.
 */
import { sql } from "drizzle-orm";
import { createDatabase } from "@/db/client";
import { setDatabase } from "@/db/queries/connection";
import { DEMO_WORKSPACE } from "@/db/seed/people";
import { getWorkspaceBySlug } from "@/db/queries/workspaces";
import { workspaces } from "@/db/schema";
import { closeVerificationPool, runVerification } from "@/server/atlas/pool";
import { WorkspaceBundle } from "@/server/bundle/bundle-schema";
import { exportWorkspaceBundle, importWorkspaceBundle, verifyBundle } from "@/server/bundle/workspace-bundle";

const db = createDatabase(`file:${process.argv[2]}`);
setDatabase(db);

async function time<T>(f: () => Promise<T>): Promise<[T, number]> {
  const t = performance.now();
  const value = await f();
  return [value, performance.now() - t];
}

const demo = await getWorkspaceBySlug({ slug: DEMO_WORKSPACE.slug });
if (!demo) throw new Error("no demo workspace in this database: run npm run db:seed on it first");
const [bundle, exportMs] = await time(() => exportWorkspaceBundle({ workspaceId: demo.id, workspaceName: demo.name }));
const text = JSON.stringify(bundle);
// Baseline for export: the certificate bodies alone, read and parsed.
const [, rawMs] = await time(async () => (await db.all<{ body: string }>(sql`SELECT body FROM certificates`)).map((r) => JSON.parse(r.body) as unknown));
const [target] = await db.insert(workspaces).values({ slug: `bench-${Date.now()}`, name: "bench import" }).returning();
const people = await db.all<{ id: string }>(sql`SELECT id FROM users LIMIT 1`);
const [counts, importMs] = await time(async () => {
  const checked = await verifyBundle(WorkspaceBundle.parse(JSON.parse(text)));
  return importWorkspaceBundle({ workspaceId: target.id, userId: people[0].id, checked });
});
// Baseline for import: re-verifying the certificates alone, which an import must do.
const [, verifyMs] = await time(async () => {
  for (const c of bundle.certificates) await runVerification({ op: "verify", certificate: c });
});
await closeVerificationPool();
console.log(`demo workspace: ${bundle.models.length} models, ${bundle.certificates.length} certificates, ${bundle.maps.length} maps, ${bundle.chains.length} chains, ${bundle.searchRecords.length} search records; bundle ${(text.length / 1024).toFixed(0)} KiB`);
console.log(`export: ${exportMs.toFixed(0)} ms (target < 10000 ms: ${exportMs < 10_000 ? "met" : "NOT met"}); baseline certificate bodies read and parsed: ${rawMs.toFixed(0)} ms; ratio ${(exportMs / rawMs).toFixed(2)}`);
console.log(`import (re-verify everything, write): ${importMs.toFixed(0)} ms (target < 10000 ms: ${importMs < 10_000 ? "met" : "NOT met"}); baseline re-verifying the certificates alone: ${verifyMs.toFixed(0)} ms; ratio ${(importMs / verifyMs).toFixed(2)}; imported ${counts.maps} maps`);
