import Fraction from "fraction.js";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { chains, maps } from "@/db/schema";
import { getChain } from "@/db/queries/chains";
import { getCertificate } from "@/db/queries/certificates";
import { certifyDecimation, certifyLumping, type Certificate } from "@/lib/certificate";
import type { TestDatabase } from "@/tests/support/database";
import type { JobRunner } from "@/server/jobs/job-runner";
import type { JobQueue } from "@/server/jobs/queue";
import { closeJobKindTestbed, openJobKindTestbed, type People } from "./jobs-fixtures";

// An invented four-state chain, lumpable by {a,b},{c,d} (Kemeny & Snell, Finite Markov Chains, §6.3:
// each row of a block puts equal mass on every block): Q = [[3/4, 1/4], [2/3, 1/3]].
const chain = {
  kind: "markov",
  labels: ["a", "b", "c", "d"],
  matrix: [
    ["1/2", "1/4", "1/8", "1/8"],
    ["1/4", "1/2", "0", "1/4"],
    ["1/3", "1/3", "1/6", "1/6"],
    ["1/6", "1/2", "1/3", "0"],
  ],
};

function built(result: { ok: true; certificate: Certificate } | { ok: false }): Certificate {
  if (!result.ok) throw new Error("the builder refused a certificate the test expects to hold");
  return result.certificate;
}

let t: TestDatabase;
let queue: JobQueue;
let runner: JobRunner;
let ws: string;
let people: People;

beforeAll(async () => {
  ({ t, queue, runner, ws, people } = await openJobKindTestbed());
});

afterAll(() => closeJobKindTestbed({ t, runner }));

describe("the verify-chain job", () => {
  it("checks lumping-then-decimation as one composite and stores the links and the chain", async () => {
    const lumping = built(certifyLumping({ chain, partition: [0, 0, 1, 1] }));
    const decimation = built(certifyDecimation({ chain: lumping.target, steps: 2 }));
    const job = await queue.enqueue({
      workspaceId: ws,
      ownerId: people.contributor.id,
      kind: "verify-chain",
      params: { name: "two-block lumping, two steps", certificates: [lumping, decimation] },
    });
    await runner.drain();
    const done = (await queue.get({ jobId: job.id, workspaceId: ws }))!;
    expect(done.error).toBeNull();
    expect(done.status).toBe("succeeded");
    const result = done.result as { verification: string; composite: string; mapIds: string[]; chainId: string; saved: boolean };
    expect(result.verification).toBe("links+composite");
    expect(result.saved).toBe(true);
    expect(result.mapIds).toHaveLength(2);

    const stored = await getChain({ workspaceId: ws, chainId: result.chainId });
    expect(stored?.links.map((l) => l.kind)).toEqual(["lumping", "decimation"]);
    const composite = await getCertificate({ address: result.composite });
    const body = JSON.parse(composite!.body) as Certificate;
    // Q² computed independently with fraction.js (a general-purpose exact-rational library).
    const Q = [
      [new Fraction(3, 4), new Fraction(1, 4)],
      [new Fraction(2, 3), new Fraction(1, 3)],
    ];
    const Q2 = Q.map((row) => [0, 1].map((j) => row[0].mul(Q[0][j]).add(row[1].mul(Q[1][j])).toFraction()));
    expect(Q2).toEqual([
      ["35/48", "13/48"],
      ["13/18", "5/18"],
    ]);
    expect(body.map).toEqual({ kind: "lumping", partition: [0, 0, 1, 1], steps: 2 });
    expect(body.target).toMatchObject({ kind: "markov", matrix: Q2 });
  });

  it("fails with the link at fault when two links do not meet, and stores nothing", async () => {
    const lumping = built(certifyLumping({ chain, partition: [0, 0, 1, 1] }));
    const offTrack = built(certifyDecimation({ chain, steps: 3 }));
    const before = { maps: (await t.db.select().from(maps)).length, chains: (await t.db.select().from(chains)).length };
    const job = await queue.enqueue({
      workspaceId: ws,
      ownerId: people.contributor.id,
      kind: "verify-chain",
      params: { name: "does not meet", certificates: [lumping, offTrack] },
    });
    await runner.drain();
    const done = (await queue.get({ jobId: job.id, workspaceId: ws }))!;
    expect(done.status).toBe("failed");
    expect(done.error).toMatch(/^link 1 ends at .*, but link 2 starts at /);
    expect({ maps: (await t.db.select().from(maps)).length, chains: (await t.db.select().from(chains)).length }).toEqual(before);
  });
  it("fails a link that is not lumpable with the checker's counterexample kept as the job's result, and stores nothing", async () => {
    const lumping = built(certifyLumping({ chain, partition: [0, 0, 1, 1] }));
    // The same claim with the blocks {a,c},{b,d}: not lumpable. By hand from the matrix above, the rows of a and c
    // put 5/8 and 1/2 on {a,c}, and 3/8 and 1/2 on {b,d}. Its address (a hash of the old content) is left off.
    const { address: _old, ...claim } = lumping as Certificate & { address?: string };
    const tampered = { ...claim, map: { ...lumping.map, partition: [0, 1, 0, 1] } } as Certificate;
    const decimation = built(certifyDecimation({ chain: lumping.target, steps: 2 }));
    const before = { maps: (await t.db.select().from(maps)).length, chains: (await t.db.select().from(chains)).length };
    const job = await queue.enqueue({
      workspaceId: ws,
      ownerId: people.contributor.id,
      kind: "verify-chain",
      params: { name: "not lumpable", certificates: [tampered, decimation] },
    });
    await runner.drain();
    const done = (await queue.get({ jobId: job.id, workspaceId: ws }))!;
    expect(done.status).toBe("failed");
    expect(done.error).toMatch(/^link 1 does not verify/);
    const result = done.result as { link: number; counterexample: { kind: string; targetBlock: number; sums: string[] } };
    expect(result.link).toBe(0);
    expect(result.counterexample.kind).toMatch(/lumpable/);
    const byHand = [
      ["5/8", "1/2"],
      ["3/8", "1/2"],
    ][result.counterexample.targetBlock];
    expect([...result.counterexample.sums].sort()).toEqual([...byHand].sort());
    expect({ maps: (await t.db.select().from(maps)).length, chains: (await t.db.select().from(chains)).length }).toEqual(before);
  });
});
