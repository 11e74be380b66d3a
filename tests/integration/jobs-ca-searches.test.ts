import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listMapsFrom } from "@/db/queries/maps";
import { getModel } from "@/db/queries/models";
import { listEcaCongruenceRecords, listSearchRecords } from "@/db/queries/search";
import { smallestBlockTable } from "@/components/atlas/smallestBlocks";
import { searchRecords } from "@/db/schema";
import { canonicalModel, modelAddress } from "@/lib/models";
import type { TestDatabase } from "@/tests/support/database";
import type { JobRunner } from "@/server/jobs/job-runner";
import type { JobQueue } from "@/server/jobs/queue";
import { closeJobKindTestbed, openJobKindTestbed, type People } from "./jobs-fixtures";

let t: TestDatabase;
let queue: JobQueue;
let runner: JobRunner;
let ws: string;
let people: People;

beforeAll(async () => {
  ({ t, queue, runner, ws, people } = await openJobKindTestbed());
});

afterAll(() => closeJobKindTestbed({ t, runner }));

const eca = (rule: number) => modelAddress(canonicalModel({ kind: "eca", rule }));

async function run(kind: string, params: unknown) {
  const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind, params });
  await runner.drain();
  return (await queue.get({ jobId: job.id, workspaceId: ws }))!;
}

async function recordsOf(rule: number) {
  const model = await getModel({ workspaceId: ws, idOrAddress: eca(rule) });
  const records = await listSearchRecords({ workspaceId: ws, modelId: model!.id });
  return { model: model!, records: records.map((r) => ({ ...r, coverage: JSON.parse(r.coverage), outcome: JSON.parse(r.outcome) })) };
}

describe("the eca-atlas job", () => {
  it("submits every coarse-graining found at block 2 and records one search per rule and kind", { timeout: 300_000 }, async () => {
    const done = await run("eca-atlas", { minBlock: 2, maxBlock: 2, search: "both" });
    expect(done.error).toBeNull();
    expect(done.status).toBe("succeeded");
    const result = done.result as { found: number; certificates: { created: number; existing: number; refused: unknown[] }; searchRecords: number };
    expect(result.certificates.refused).toEqual([]);
    expect(result.certificates.created + result.certificates.existing).toBe(result.found);
    expect(result.searchRecords).toBe(512);
    expect(await t.db.select().from(searchRecords)).toHaveLength(512);
  });

  it("fills the smallest-block table: every rule searched at block 2, the identity found there, rule 30 with none", async () => {
    const table = smallestBlockTable(await listEcaCongruenceRecords({ workspaceId: ws }));
    expect(table.unsearched).toEqual([]);
    // Rule 204 is the identity (DOMAIN.md, Wolfram code): every partition of the four block states commutes with it.
    expect(table.byBlock.map((g) => g.block)).toEqual([2]);
    expect(table.byBlock[0].rules.map((c) => c.rule)).toContain(204);
    // Rule 30 has no proper partition coarse-graining at block 2 (README, "N = 9": none up to block 9).
    expect(table.none.map((g) => g.upTo)).toEqual([2]);
    expect(table.none[0].rules.map((c) => c.rule)).toContain(30);
    expect(table.byBlock[0].rules.length + table.none[0].rules.length).toBe(256);
  });

  it("finds what follows from the definitions for the identity, the shift and the zero rule", async () => {
    // Rule 204 is the identity and rule 170 copies the right neighbour (DOMAIN.md, Wolfram code): every
    // one of the 2^4 − 2 = 14 onto-{0,1} projections of 2-cell blocks commutes, with the rule itself as
    // target (derived by hand from the definitions).
    for (const rule of [204, 170]) {
      const { records } = await recordsOf(rule);
      const projections = records.find((r) => r.kind === "binary-projections")!;
      expect(projections.coverage.blocks).toEqual([2]);
      expect(projections.outcome.targets).toEqual([eca(rule)]);
      expect(projections.outcome.byTarget).toEqual([{ target: rule, blocks: [{ block: 2, count: "14" }] }]);
    }
    // Rule 0 sends every window to 0: a projection commutes exactly when the coarse rule is the constant
    // p(00) — 0 for the 7 projections with p(00) = 0, 255 for the 7 with p(00) = 1 (by hand).
    const zero = await recordsOf(0);
    const projections = zero.records.find((r) => r.kind === "binary-projections")!;
    expect(projections.outcome.byTarget).toEqual([
      { target: 0, blocks: [{ block: 2, count: "7" }] },
      { target: 255, blocks: [{ block: 2, count: "7" }] },
    ]);
    const fromZero = await listMapsFrom({ workspaceId: ws, modelId: zero.model.id, limit: 200 });
    expect(fromZero.items.filter((m) => m.kind === "projection").map((m) => m.target.rule).sort((a, b) => a! - b!)).toEqual([0, 255]);
  });
});

describe("the eca-atlas job over partitions", () => {
  it("stores every smallest-block coarse-graining up to block 4, the many-class ones too (rule 43: 12 classes at block 4)", { timeout: 300_000 }, async () => {
    const done = await run("eca-atlas", { minBlock: 2, maxBlock: 4, search: "partitions" });
    expect(done.status).toBe("succeeded");
    const result = done.result as { found: number; certificates: { created: number; existing: number; refused: { what: string }[] } };
    // the server's size bound used to count the 12-class target's alphabet: 12^12 windows instead of the check's 2^12
    expect(result.certificates.refused).toEqual([]);
    expect(result.certificates.created + result.certificates.existing).toBe(result.found);
    const { model } = await recordsOf(43);
    const fromRule43 = await listMapsFrom({ workspaceId: ws, modelId: model.id, limit: 200 });
    expect(fromRule43.items.some((m) => m.kind === "projection" && m.block === 4)).toBe(true);
  });
});

describe("the search-projection job with steps apart from the block size", () => {
  it("stores the radius-2 coarse-graining of the identity at N = 2, T = 3 and records the search at those steps, out of Ask's reach", { timeout: 300_000 }, async () => {
    const done = await run("search-projection", { rule: 204, minBlock: 2, maxBlock: 2, steps: 3, search: "projections" });
    expect(done.status).toBe("succeeded");
    const result = done.result as { found: number; certificates: { refused: unknown[] } };
    expect([result.found, result.certificates.refused]).toEqual([1, []]);
    // Rule 204 is the identity (DOMAIN.md, Wolfram code): all 2^4 − 2 = 14 onto projections commute, onto the
    // radius-2 identity, whose table entry is x₀, bit 2 of the index (DOMAIN.md §2b, R = ⌈3/2⌉ = 2; by hand)
    const identity2 = { k: 2, r: 2, table: Array.from({ length: 32 }, (_, i) => (i >> 2) & 1) };
    const { model, records } = await recordsOf(204);
    const record = records.find((r) => r.coverage.steps === 3)!;
    expect(record.coverage).toMatchObject({ blocks: [2], steps: 3, targetKinds: [], exhaustive: true });
    expect(record.outcome.byTarget).toEqual([{ target: identity2, blocks: [{ block: 2, count: "14" }] }]);
    const target = modelAddress(canonicalModel({ kind: "ca", ...identity2 }));
    expect(record.outcome.targets).toEqual([target]);
    const maps = await listMapsFrom({ workspaceId: ws, modelId: model.id, limit: 200 });
    expect(maps.items.some((m) => m.kind === "projection" && m.block === 2 && m.steps === 3)).toBe(true);
  });

  it("refuses steps above 2N for the smallest block, naming the field", async () => {
    await expect(queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "search-projection", params: { rule: 90, minBlock: 2, maxBlock: 3, steps: 5 } })).rejects.toThrow(/steps/);
  });
});

describe("the search-projection job", () => {
  it("finds rule 146 → rule 128 at block 3 and stores it with the search that found it", async () => {
    const done = await run("search-projection", { rule: 146, minBlock: 3, maxBlock: 3, search: "projections" });
    expect(done.status).toBe("succeeded");
    // Israeli & Goldenfeld, Phys. Rev. Lett. 92, 074105 (2004): rule 146 coarse-grains onto rule 128 at
    // block size 3 (the pairing is recalled from memory).
    const { model, records } = await recordsOf(146);
    const maps = await listMapsFrom({ workspaceId: ws, modelId: model.id, block: 3, limit: 200 });
    expect(maps.items.map((m) => m.target.rule)).toContain(128);
    const block3 = records.find((r) => r.kind === "binary-projections" && r.maxBlock === 3)!;
    expect(block3.jobId).toBe(done.id);
    expect(block3.outcome.targets).toContain(eca(128));
  });

  it("refuses a rule out of range with a 400 naming params.rule", async () => {
    const err = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "search-projection", params: { rule: 256 } }).catch((e) => e);
    expect(err.status).toBe(400);
    expect(err.field).toBe("params.rule");
  });
});
