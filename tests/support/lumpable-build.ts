import type { BuildRequest } from "@/server/atlas/verify-task";

/**
 * The i-th of an endless family of distinct lumpable chains: states B and C have equal rows, so
 * the partition {A}{B,C} is a lumping (the criterion of Kemeny & Snell, Finite Markov Chains, §6.3:
 * equal block sums from every state of a block; section number recalled from memory). x = 1/(i+2) and y = 1/(i+3) make each chain different.
 */
export function lumpableBuild(i: number): BuildRequest {
  const row = (d: number) => [`1/${d}`, `${d - 1}/${2 * d}`, `${d - 1}/${2 * d}`];
  return {
    kind: "lumping",
    partition: [0, 1, 1],
    chain: { kind: "markov", labels: ["A", "B", "C"], matrix: [row(i + 2), row(i + 3), row(i + 3)] },
  } as BuildRequest;
}
