/**
 * Every proper congruence of a supercell CA. A congruence θ is the join of the principal congruences Cg(x, y) of its
 * pairs (Burris & Sankappanavar, A Course in Universal Algebra, 1981, ch. II; the chapter is recalled from memory),
 * and every congruence between Cg(x, y) and θ is proper when θ is, so starting from the principal ones and joining
 * one more pair at a time (the closure of θ ∪ {(x, y)}) reaches each proper congruence. A congruence whose every such join is total is maximal, and that is known
 * exactly here.
 */
import { closurePartition, congruenceClosure, findRoot, type Closure } from "./congruence";
import type { PrincipalScan } from "./principalCongruences";
import type { Supercell } from "./supercell";

export interface LatticeMember {
  partition: number[];
  maximal: boolean;
}

/** Every proper congruence from a complete principal scan, by canonical partition; null when `shouldStop` says so. */
export function allProperCongruences(cell: Supercell, scan: PrincipalScan, shouldStop: () => boolean = () => false): Map<string, LatticeMember> | null {
  const { n } = cell;
  const found = new Map<string, LatticeMember>();
  const queue: Closure[] = [];
  for (const [key, entry] of scan.found) {
    found.set(key, { partition: entry.partition, maximal: true });
    queue.push(entry.closure);
  }
  for (let next = 0; next < queue.length; next++) {
    if (shouldStop()) return null;
    const closure = queue[next];
    const member = found.get(closurePartition(closure).join(",")) as LatticeMember;
    for (let x = 0; x < n; x++)
      for (let y = x + 1; y < n; y++) {
        if (scan.knownTotal[x * n + y] || findRoot(closure.parent, x) === findRoot(closure.parent, y)) continue;
        const joined = congruenceClosure(cell, closure, [[x, y]], { knownTotal: scan.knownTotal });
        if (!joined) continue;
        member.maximal = false;
        const partition = closurePartition(joined);
        const key = partition.join(",");
        if (found.has(key)) continue;
        found.set(key, { partition, maximal: true });
        queue.push(joined);
      }
  }
  return found;
}
