/**
 * Every proper congruence of a supercell CA. A congruence θ is the join of the principal congruences Cg(x, y) of its
 * pairs (Burris & Sankappanavar, A Course in Universal Algebra, 1981, ch. II; the chapter is recalled from memory),
 * and every congruence between Cg(x, y) and θ is proper when θ is, so starting from the principal ones and joining
 * one more pair at a time (the closure of θ ∪ {(x, y)}) reaches each proper congruence. A congruence whose every such join is total is maximal, and that is known
 * exactly here.
 */
import { closurePartition, congruenceClosure, findRoot, type Closure } from "./congruence";

/** The closure's classes as a string key: state s's class, numbered by first appearance, one character each. */
function canonicalKey(closure: Closure): string {
  const n = closure.parent.length;
  const label = new Int32Array(n).fill(-1);
  let key = "";
  let next = 0;
  for (let s = 0; s < n; s++) {
    const r = findRoot(closure.parent, s);
    if (label[r] < 0) label[r] = next++;
    key += String.fromCharCode(48 + label[r]);
  }
  return key;
}
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
  for (const entry of scan.found.values()) {
    found.set(canonicalKey(entry.closure), { partition: entry.partition, maximal: true });
    queue.push(entry.closure);
  }
  const roots: number[] = [];
  for (let next = 0; next < queue.length; next++) {
    if (shouldStop()) return null;
    const closure = queue[next];
    const member = found.get(canonicalKey(closure)) as LatticeMember;
    roots.length = 0;
    for (let s = 0; s < n; s++) if (closure.parent[s] === s) roots.push(s);
    // joining any pair of two classes gives the same congruence: one pair per two classes
    for (let a = 0; a < roots.length; a++)
      for (let b = a + 1; b < roots.length; b++) {
        const [x, y] = [roots[a], roots[b]];
        if (scan.knownTotal[x * n + y]) continue;
        const joined = congruenceClosure(cell, closure, [[x, y]], { knownTotal: scan.knownTotal });
        if (!joined) continue;
        member.maximal = false;
        const key = canonicalKey(joined);
        if (found.has(key)) continue;
        found.set(key, { partition: closurePartition(joined), maximal: true });
        queue.push(joined);
      }
  }
  return found;
}
