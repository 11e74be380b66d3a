import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getModel } from "@/db/queries/models";
import { listSearchRecords } from "@/db/queries/search";
import { totalisticTable } from "@/lib/discovery";
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

const address = (code: number) => modelAddress(canonicalModel({ kind: "ca", k: 3, r: 1, table: Array.from(totalisticTable(code).table) }));

describe("the totalistic-atlas job", () => {
  it("certifies and stores the congruences of codes 0–40 at blocks 1 and 2, with one search record per code", { timeout: 300_000 }, async () => {
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "totalistic-atlas", params: { minCode: 0, maxCode: 40, blocks: [1, 2] } });
    await runner.drain();
    const done = (await queue.get({ jobId: job.id, workspaceId: ws }))!;
    expect(done.error).toBeNull();
    expect(done.status).toBe("succeeded");
    const result = done.result as { found: number; certificates: { created: number; existing: number; refused: unknown[] }; searchRecords: number };
    expect(result.certificates.refused).toEqual([]);
    expect(result.found).toBeGreaterThan(0);
    expect(result.certificates.created + result.certificates.existing).toBe(result.found);
    expect(result.searchRecords).toBe(41);
    // code 0 sends every neighbourhood to 0, so every partition of the three states is a congruence (by hand):
    // {0,1}{2}, {0,2}{1}, {0}{1,2} at block 1
    const model = await getModel({ workspaceId: ws, idOrAddress: address(0) });
    // browsable: each code is listed and searchable under its own name, not 2,187 times "CA k=3, r=1"
    expect([model!.name, (await getModel({ workspaceId: ws, idOrAddress: address(40) }))!.name]).toEqual(["Three-state totalistic code 0", "Three-state totalistic code 40"]);
    const [record] = await listSearchRecords({ workspaceId: ws, modelId: model!.id });
    const outcome = JSON.parse(record.outcome) as { congruences: { block: number; partition: number[] }[] };
    expect(outcome.congruences.filter((c) => c.block === 1).map((c) => c.partition.join("")).sort()).toEqual(["001", "010", "011"]);
  });

  it("refuses bad parameters naming the field", async () => {
    await expect(queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "totalistic-atlas", params: { minCode: 5, maxCode: 2 } })).rejects.toThrow(/maxCode/);
  });
});
