import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listMapsFrom } from "@/db/queries/maps";
import { getModel } from "@/db/queries/models";
import { listSearchRecords } from "@/db/queries/search";
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

// Two interchangeable service bays (invented numbers): empty, left busy, right busy, both busy.
const bays = {
  kind: "markov" as const,
  labels: ["empty", "left", "right", "both"],
  matrix: [
    ["1/2", "1/4", "1/4", "0"],
    ["1/3", "1/3", "0", "1/3"],
    ["1/3", "0", "1/3", "1/3"],
    ["0", "1/4", "1/4", "1/2"],
  ],
};

describe("the lump-chain job", () => {
  it("refines 'idle vs busy' to the coarsest lumping and stores it as a certified map with its search", async () => {
    // By hand: from {left, right, both} the mass into {empty} is 1/3, 1/3, 0, so "both" splits off;
    // then left and right each put 1/3 on {empty}, {left, right} and {both} (Kemeny & Snell's
    // strong-lumpability condition, Finite Markov Chains §6.3): partition [0, 1, 1, 2].
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "lump-chain", params: { chain: bays, observable: ["idle", "busy", "busy", "busy"] } });
    await runner.drain();
    const done = (await queue.get({ jobId: job.id, workspaceId: ws }))!;
    expect(done.error).toBeNull();
    expect(done.status).toBe("succeeded");
    const result = done.result as { blocks: number; partition: number[]; certificate: { status: string }; searchRecord: string };
    expect(result).toMatchObject({ blocks: 3, partition: [0, 1, 1, 2], certificate: { status: "created" }, searchRecord: "stored" });

    const model = await getModel({ workspaceId: ws, idOrAddress: modelAddress(canonicalModel(bays)) });
    const maps = await listMapsFrom({ workspaceId: ws, modelId: model!.id });
    expect(maps.items.map((m) => m.kind)).toEqual(["lumping"]);
    const [record] = await listSearchRecords({ workspaceId: ws, modelId: model!.id });
    expect(record.kind).toBe("coarsest-lumping");
    expect(record.jobId).toBe(job.id);
  });

  it("stores no map when every state must stay apart, but records the search", async () => {
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "lump-chain", params: { chain: bays, observable: [0, 1, 2, 3] } });
    await runner.drain();
    const done = (await queue.get({ jobId: job.id, workspaceId: ws }))!;
    expect(done.status).toBe("succeeded");
    expect(done.result).toMatchObject({ blocks: 4, certificate: null, searchRecord: "stored" });
  });

  it("refuses an observable of the wrong length with a 400 naming params.observable", async () => {
    const err = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "lump-chain", params: { chain: bays, observable: [0, 1] } }).catch((e) => e);
    expect(err.status).toBe(400);
    expect(err.field).toBe("params.observable");
  });

  it("with exact: true finds the coarsest exact lumping and stores it as an exact-lumping map", async () => {
    // Hand-worked in lib/markov/checkExactLumping.test.ts: {b, c} receive 1/4 each from {a} and 3/4 each from {b, c},
    // so [0, 1, 1] is exactly lumpable, while strongly b and c send 1/3 and 1/6 into {a}.
    const hand = { kind: "markov" as const, labels: ["a", "b", "c"], matrix: [["1/2", "1/4", "1/4"], ["1/3", "1/3", "1/3"], ["1/6", "5/12", "5/12"]] };
    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "lump-chain", params: { chain: hand, observable: ["x", "y", "y"], exact: true } });
    await runner.drain();
    const done = (await queue.get({ jobId: job.id, workspaceId: ws }))!;
    expect(done.error).toBeNull();
    expect(done.result).toMatchObject({ blocks: 2, partition: [0, 1, 1], certificate: { status: "created" }, searchRecord: "stored" });
    const model = await getModel({ workspaceId: ws, idOrAddress: modelAddress(canonicalModel(hand)) });
    expect((await listMapsFrom({ workspaceId: ws, modelId: model!.id })).items.map((m) => m.kind)).toEqual(["exact-lumping"]);
    const [record] = await listSearchRecords({ workspaceId: ws, modelId: model!.id });
    expect(record.kind).toBe("coarsest-exact-lumping");
  });
});
