import { MatrixInputError, type Matrix } from "@/lib/markov";
import { scaleEntries, sparseFromMatrix } from "./markov/sparseChain";

/** Largest chain allAllLumpings enumerates (Bell(10) = 115,975 partitions). */
export const MAX_ENUMERATED_STATES = 10;

/**
 * Every strongly (or, with `exact`, exactly) lumpable partition of a small chain, by enumerating all set partitions as restricted growth
 * strings (each already in canonical form), coarsest first. Kept plain on purpose: it is the reference the fast
 * refinement is tested against, and a way to show newcomers the whole lattice.
 */
export function allLumpings(chain: Matrix, options: { exact?: boolean } = {}): number[][] {
  const n = chain.length;
  if (n < 1 || n > MAX_ENUMERATED_STATES) throw new MatrixInputError("matrix", `allLumpings enumerates chains of 1..${MAX_ENUMERATED_STATES} states, got ${n}`);
  const sparse = sparseFromMatrix(chain);
  const scaled = scaleEntries(sparse);
  // dense integer numerators over a common denominator, so that equal sums are equal integers
  const num: (number | bigint)[][] = Array.from({ length: n }, () => new Array(n).fill(scaled.kind === "number" ? 0 : 0n));
  for (let i = 0; i < n; i++)
    for (let e = sparse.rowStart[i]; e < sparse.rowStart[i + 1]; e++) {
      // exact lumpability is strong lumpability's condition on the columns (Buchholz 1994; DOMAIN.md §2b)
      if (options.exact) num[sparse.col[e]][i] = scaled.num[e];
      else num[i][sparse.col[e]] = scaled.num[e];
    }
  const found: number[][] = [];
  const rgs = new Array<number>(n).fill(0);
  const visit = (i: number, blocks: number): void => {
    if (i === n) {
      if (lumpable(num, rgs, blocks)) found.push(rgs.slice());
      return;
    }
    for (let b = 0; b <= blocks; b++) {
      rgs[i] = b;
      visit(i + 1, Math.max(blocks, b + 1));
    }
  };
  rgs[0] = 0;
  visit(1, 1);
  return found.sort((a, b) => Math.max(...a) - Math.max(...b));
}

function lumpable(num: (number | bigint)[][], partition: number[], blocks: number): boolean {
  const n = partition.length;
  const first = new Array<number>(blocks).fill(-1);
  const sums: (number | bigint)[][] = [];
  for (let i = 0; i < n; i++) {
    const row = new Array<number | bigint>(blocks).fill(typeof num[i][0] === "bigint" ? 0n : 0);
    for (let j = 0; j < n; j++) (row[partition[j]] as number) += num[i][j] as number;
    const I = partition[i];
    if (first[I] < 0) {
      first[I] = i;
      sums[I] = row;
    } else if (row.some((v, J) => v !== sums[I][J])) return false;
  }
  return true;
}
