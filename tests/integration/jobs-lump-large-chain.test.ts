import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { permutationMixture } from "@/lib/discovery";
import { checkExactLumping, type Matrix } from "@/lib/markov";
import { ZERO, add, formatRational, type Rational } from "@/lib/rational";
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

/** The generated chain as a dense matrix, repeated columns added up. */
function dense(spec: { groups: number; members: number; seed: number }): Matrix {
  const chain = permutationMixture(spec);
  const p: Rational[][] = Array.from({ length: chain.size }, () => new Array<Rational>(chain.size).fill(ZERO));
  for (let i = 0; i < chain.size; i++) for (let e = chain.rowStart[i]; e < chain.rowStart[i + 1]; e++) p[i][chain.col[e]] = add(p[i][chain.col[e]], chain.value[e]);
  return p;
}

/** Every set partition of n states as a restricted growth string. */
function* setPartitions(n: number, prefix: number[] = [0]): Generator<number[]> {
  if (prefix.length === n) {
    yield prefix;
    return;
  }
  const top = Math.max(...prefix) + 1;
  for (let b = 0; b <= top; b++) yield* setPartitions(n, [...prefix, b]);
}

/** Brute force with the core's dense checker: the exactly lumpable partitions with the fewest blocks. */
function coarsestByBruteForce(p: Matrix): { partition: number[]; lumped: string[][] }[] {
  let best: { partition: number[]; lumped: string[][] }[] = [];
  let fewest = Infinity;
  for (const partition of setPartitions(p.length)) {
    const blocks = Math.max(...partition) + 1;
    if (blocks > fewest) continue;
    const check = checkExactLumping(p, partition);
    if (!check.ok) continue;
    const found = { partition, lumped: check.lumped.map((row) => row.map(formatRational)) };
    if (blocks < fewest) [best, fewest] = [[found], blocks];
    else best.push(found);
  }
  return best;
}

describe("the lump-large-chain job", () => {
  it("finds the coarsest exact lumping of a small generated chain, the one brute force over all 4,140 partitions finds", async () => {
    const spec = { generator: "permutation-mixture" as const, groups: 4, members: 2, seed: 5 };
    const [expected, ...others] = coarsestByBruteForce(dense(spec));
    // the coarsest exact lumping is unique (DOMAIN.md §2b), so brute force finds one partition with the fewest blocks
    expect(others).toEqual([]);

    const job = await queue.enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "lump-large-chain", params: { chain: spec } });
    await runner.drain();
    const done = (await queue.get({ jobId: job.id, workspaceId: ws }))!;
    expect(done.error).toBeNull();
    expect(done.status).toBe("succeeded");
    expect(done.progress).toBe(1);
    const result = done.result as { states: number; transitions: number; blocks: number; partition: number[]; partitionDigest: string; check: { status: string }; lumped: { from: number; to: number; value: string }[] };
    expect(result).toMatchObject({ states: 8, transitions: 80, blocks: Math.max(...expected.partition) + 1, partition: expected.partition, check: { status: "holds" } });
    expect(result.partitionDigest).toBe(`sha256:${createHash("sha256").update(expected.partition.join(",")).digest("hex")}`);
    const lumped = expected.lumped.map((row) => row.map(() => "0"));
    for (const e of result.lumped) lumped[e.from][e.to] = e.value;
    expect(lumped).toEqual(expected.lumped);
  }, 120_000);

  it("refuses a chain above two million states with a 400 naming the field", async () => {
    const err = await queue
      .enqueue({ workspaceId: ws, ownerId: people.contributor.id, kind: "lump-large-chain", params: { chain: { generator: "permutation-mixture", groups: 2000, members: 2000, seed: 1 } } })
      .catch((e) => e);
    expect(err.status).toBe(400);
    expect(err.field).toBe("params.chain.members");
  });
});
