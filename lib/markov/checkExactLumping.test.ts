import { describe, expect, it } from "vitest";
import { certifyExactLumping, certifyLumping } from "@/lib/certificate";
import { parseRational } from "@/lib/rational";
import { verifyCertificate } from "@/lib/verify";
import { checkExactLumping } from "./checkExactLumping";
import { checkLumping } from "./checkLumping";
import { formatMatrix, type Matrix } from "./matrix";

const q = (rows: string[][]): Matrix => rows.map((r) => r.map(parseRational));

/**
 * Hand-worked (DOMAIN.md §2b, Buchholz 1994): P on states 0, 1, 2 with blocks {0}, {1, 2}.
 * Column sums into block {1, 2}: from {0}: P[0][1] = P[0][2] = 1/4; from {1, 2}: 1/3 + 5/12 = 3/4 for both columns.
 * Lumped Q[I][J] = |J| · Σ_{i∈I} P[i][j] / |I|: Q[0] = [1/2, 2·1/4] = [1/2, 1/2]; Q[1] = [(1/3 + 1/6)/2, 2·(3/4)/2] = [1/4, 3/4].
 * Strongly lumpable it is not: rows 1 and 2 send 1/3 and 1/6 into block {0}.
 */
const HAND = q([
  ["1/2", "1/4", "1/4"],
  ["1/3", "1/3", "1/3"],
  ["1/6", "5/12", "5/12"],
]);

describe("checkExactLumping", () => {
  it("holds on a hand-worked chain where strong lumpability fails, with the lumped chain written out", () => {
    const check = checkExactLumping(HAND, [0, 1, 1]);
    expect(check.ok && formatMatrix(check.lumped)).toEqual([
      ["1/2", "1/2"],
      ["1/4", "3/4"],
    ]);
    expect(checkLumping(HAND, [0, 1, 1])).toEqual({
      ok: false,
      counterexample: { kind: "not-lumpable", block: 1, states: [1, 2], targetBlock: 0, sums: ["1/3", "1/6"] },
    });
  });

  it("fails with the two states of the target block and both column sums", () => {
    // from block {0, 1} into state 0: 1/2 + 1/3 = 5/6, into state 1: 1/4 + 1/3 = 7/12
    expect(checkExactLumping(HAND, [0, 0, 1])).toEqual({
      ok: false,
      counterexample: { kind: "not-exactly-lumpable", block: 0, targetBlock: 0, states: [0, 1], sums: ["5/6", "7/12"] },
    });
  });

  it("coincides with strong lumping on a symmetric chain (both give the same lumped chain)", () => {
    const p = q([
      ["0", "1/2", "1/2"],
      ["1/2", "0", "1/2"],
      ["1/2", "1/2", "0"],
    ]);
    const exact = checkExactLumping(p, [0, 1, 1]);
    const strong = checkLumping(p, [0, 1, 1]);
    expect(exact.ok && formatMatrix(exact.lumped)).toEqual([
      ["0", "1"],
      ["1/2", "1/2"],
    ]);
    expect(strong.ok && formatMatrix(strong.lumped)).toEqual(exact.ok && formatMatrix(exact.lumped));
  });

  it("rejects a partition of the wrong length with a named field", () => {
    expect(() => checkExactLumping(HAND, [0, 1])).toThrow(/partition/);
  });

  it("does not mutate its inputs", () => {
    const partition = [1, 0, 0];
    const before = formatMatrix(HAND);
    checkExactLumping(HAND, partition);
    expect(partition).toEqual([1, 0, 0]);
    expect(formatMatrix(HAND)).toEqual(before);
  });
});

describe("exact-lumping certificates", () => {
  const chain = { kind: "markov", labels: ["a", "b", "c"], matrix: formatMatrix(HAND) };

  it("are issued and verified by the checker; a strong-lumping certificate for the same partition is refused", () => {
    const built = certifyExactLumping({ chain, partition: [0, 1, 1] });
    expect(built.ok).toBe(true);
    if (!built.ok) return;
    expect(built.certificate.map).toEqual({ kind: "exact-lumping", partition: [0, 1, 1], steps: 1 });
    expect(built.certificate.target).toMatchObject({ labels: ["{a}", "{b,c}"], matrix: [["1/2", "1/2"], ["1/4", "3/4"]] });
    expect(verifyCertificate(built.certificate).status).toBe("holds");
    expect(certifyLumping({ chain, partition: [0, 1, 1] }).ok).toBe(false);
  });

  it("fail verification with a counterexample when the partition or the lumped entry is wrong", () => {
    const built = certifyExactLumping({ chain, partition: [0, 1, 1] });
    if (!built.ok) throw new Error("expected a certificate");
    const { address: _address, ...unsealed } = built.certificate;
    const wrongEntry = { ...unsealed, target: { kind: "markov", labels: ["{a}", "{b,c}"], matrix: [["1/2", "1/2"], ["1/3", "2/3"]] } };
    expect(verifyCertificate(wrongEntry)).toMatchObject({ status: "fails", counterexample: { kind: "lumped-entry-mismatch", block: 1, targetBlock: 0, claimed: "1/3", actual: "1/4" } });
    const wrongPartition = { ...unsealed, map: { kind: "exact-lumping", partition: [0, 0, 1] } };
    expect(verifyCertificate(wrongPartition)).toMatchObject({ status: "fails", counterexample: { kind: "not-exactly-lumpable", states: [0, 1], sums: ["5/6", "7/12"] } });
  });
});
