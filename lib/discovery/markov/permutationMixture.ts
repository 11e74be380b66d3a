/**
 * A generated chain for large exact-lumping runs (our own construction): a mixture of ten permutations with weights
 * k/55. State (b, m) of `groups` groups of `members` moves to (b + c_k mod groups, σ_{k,b}(m)) with weight
 * (((k + b) mod 10) + 1)/55; the weights rotate with b, so column totals differ from group to group, while each
 * permutation reaches every state of a group exactly once from one source group, so the groups are exactly lumpable.
 */
import { rational, type Rational } from "@/lib/rational";
import type { SparseChain } from "./sparseChain";
import { seededRandom } from "@/lib/random";

/** A permutation-mixture chain's parameters. */
export interface PermutationMixtureSpec {
  groups: number;
  members: number;
  seed: number;
}

const SHIFTS = [1, 2, 3, 5, 8, 13, 21, 34, 55, 89];

/** Entries of the permutation mixture: for each state, ten (column, weight k/55) pairs, columns ascending. */
export function permutationMixture({ groups, members, seed }: PermutationMixtureSpec): SparseChain {
  const random = seededRandom(seed);
  const n = groups * members;
  const per = SHIFTS.length;
  const rowStart = Int32Array.from({ length: n + 1 }, (_, i) => i * per);
  const col = new Int32Array(n * per);
  const weights: Rational[] = SHIFTS.map((_, k) => rational(k + 1, 55));
  const value = new Array<Rational>(n * per);
  const sigma = new Int32Array(members);
  for (let k = 0; k < per; k++) {
    for (let b = 0; b < groups; b++) {
      for (let m = 0; m < members; m++) sigma[m] = m;
      for (let m = members - 1; m > 0; m--) {
        const r = Math.floor(random() * (m + 1));
        [sigma[m], sigma[r]] = [sigma[r], sigma[m]];
      }
      const to = ((b + SHIFTS[k]) % groups) * members;
      for (let m = 0; m < members; m++) {
        const e = (b * members + m) * per + k;
        col[e] = to + sigma[m];
        // the weights rotate with the source group, so column totals differ between groups (not doubly stochastic)
        value[e] = weights[(k + b) % per];
      }
    }
  }
  // columns ascending within each row, as the sparse format has them
  for (let i = 0; i < n; i++) {
    const order = Array.from({ length: per }, (_, k) => i * per + k).sort((x, y) => col[x] - col[y]);
    const cs = order.map((e) => col[e]);
    const vs = order.map((e) => value[e]);
    for (let k = 0; k < per; k++) {
      col[i * per + k] = cs[k];
      value[i * per + k] = vs[k];
    }
  }
  return { size: n, rowStart, col, value };
}

