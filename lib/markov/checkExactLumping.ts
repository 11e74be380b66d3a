import { ZERO, add, equals, formatRational, mul, rational, type Rational } from "@/lib/rational";
import { canonicalPartition, blockCount } from "./canonicalPartition";
import { MatrixInputError, type Matrix } from "./matrix";

/** Two states of one target block that receive different totals from one source block. */
export type ExactLumpingCounterexample = {
  kind: "not-exactly-lumpable";
  /** the source block I */
  block: number;
  /** the target block J and two of its states j, j′ (0-based) */
  targetBlock: number;
  states: [number, number];
  /** Σ_{i∈I} P[i][j] and Σ_{i∈I} P[i][j′] */
  sums: [string, string];
};

export type ExactLumpingCheck = { ok: true; partition: number[]; lumped: Matrix } | { ok: false; counterexample: ExactLumpingCounterexample };

/**
 * Exact lumpability (Buchholz, J. Appl. Probab. 31, 59–75, 1994; DOMAIN.md §2b): for every pair of blocks I, J the
 * column sum Σ_{i∈I} P[i][j] is the same for every j in J. The lumped chain is Q[I][J] = |J| · Σ_{i∈I} P[i][j] / |I|.
 */
export function checkExactLumping(p: Matrix, partition: readonly number[]): ExactLumpingCheck {
  if (partition.length !== p.length)
    throw new MatrixInputError("partition", `has ${partition.length} entries for a ${p.length}-state chain`);
  const blocks = canonicalPartition(partition);
  const B = blockCount(blocks);
  const size = new Array<number>(B).fill(0);
  for (const b of blocks) size[b]++;
  // into[I][j] = Σ_{i∈I} P[i][j]
  const into: Rational[][] = Array.from({ length: B }, () => new Array<Rational>(p.length).fill(ZERO));
  for (let i = 0; i < p.length; i++) for (let j = 0; j < p.length; j++) into[blocks[i]][j] = add(into[blocks[i]][j], p[i][j]);
  const firstOf = blocks.map((b) => blocks.indexOf(b));
  const lumped: Rational[][] = Array.from({ length: B }, () => new Array<Rational>(B).fill(ZERO));
  for (let I = 0; I < B; I++) {
    for (let j = 0; j < p.length; j++) {
      const J = blocks[j];
      const first = firstOf[j];
      if (!equals(into[I][j], into[I][first]))
        return {
          ok: false,
          counterexample: { kind: "not-exactly-lumpable", block: I, targetBlock: J, states: [first, j], sums: [formatRational(into[I][first]), formatRational(into[I][j])] },
        };
      if (first === j) lumped[I][J] = mul(into[I][j], rational(BigInt(size[J]), BigInt(size[I])));
    }
  }
  return { ok: true, partition: blocks, lumped };
}
