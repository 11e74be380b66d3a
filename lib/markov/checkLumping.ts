import { ZERO, add, equals, formatRational, type Rational } from "@/lib/rational";
import { canonicalPartition, blockCount } from "./canonicalPartition";
import { MatrixInputError, type Matrix } from "./matrix";

/** Two states of one block whose probabilities of moving into the target block differ. */
export type LumpingCounterexample = {
  kind: "not-lumpable";
  block: number;
  states: [number, number];
  targetBlock: number;
  sums: [string, string];
};

export type LumpingCheck = { ok: true; partition: number[]; lumped: Matrix } | { ok: false; counterexample: LumpingCounterexample };

/**
 * Strong lumpability (Kemeny & Snell, Finite Markov Chains, 1960, §6.3): for every pair of blocks I, J
 * the sum of P[i][j] over j in J is the same for every i in I; that common sum is the lumped Q[I][J].
 */
export function checkLumping(p: Matrix, partition: readonly number[]): LumpingCheck {
  if (partition.length !== p.length)
    throw new MatrixInputError("partition", `has ${partition.length} entries for a ${p.length}-state chain`);
  const blocks = canonicalPartition(partition);
  const B = blockCount(blocks);
  const firstOf = blocks.map((b) => blocks.indexOf(b));
  const lumped: Rational[][] = Array.from({ length: B }, () => new Array<Rational>(B).fill(ZERO));
  for (let i = 0; i < p.length; i++) {
    const sums = new Array<Rational>(B).fill(ZERO);
    for (let j = 0; j < p.length; j++) sums[blocks[j]] = add(sums[blocks[j]], p[i][j]);
    const I = blocks[i];
    if (firstOf[i] === i) {
      lumped[I] = sums;
      continue;
    }
    for (let J = 0; J < B; J++)
      if (!equals(sums[J], lumped[I][J]))
        return {
          ok: false,
          counterexample: {
            kind: "not-lumpable",
            block: I,
            states: [firstOf[i], i],
            targetBlock: J,
            sums: [formatRational(lumped[I][J]), formatRational(sums[J])],
          },
        };
  }
  return { ok: true, partition: blocks, lumped };
}
