/**
 * Proper principal congruences Cg(x, y) of a supercell CA, with the pruning that makes the all-pairs scan cheap:
 * a pair whose closure is total is remembered, and a later closure that meets it is total too.
 */
import { closurePartition, congruenceClosure, type Closure } from "./congruence";
import type { Supercell } from "./supercell";

export interface PrincipalScan {
  /** pairs whose principal congruence is total (n × n flags), reusable by later closures */
  knownTotal: Uint8Array;
  /** distinct proper principal congruences, keyed by canonical partition */
  found: Map<string, { closure: Closure; partition: number[]; pair: [number, number] }>;
  /** false when stopped before every pair was closed */
  complete: boolean;
}

export interface PrincipalScanOptions {
  /** stop after the first proper congruence */
  first?: boolean;
  /** polled between pairs with the fraction of pairs done; return true to stop */
  shouldStop?: (fraction: number) => boolean;
}

export function scanPrincipalCongruences(cell: Supercell, options: PrincipalScanOptions = {}): PrincipalScan {
  const { n } = cell;
  const knownTotal = new Uint8Array(n * n);
  const found: PrincipalScan["found"] = new Map();
  const pairs = (n * (n - 1)) / 2;
  let done = 0;
  for (let x = 0; x < n; x++) {
    for (let y = x + 1; y < n; y++, done++) {
      if (options.shouldStop?.(done / pairs)) return { knownTotal, found, complete: false };
      const closure = congruenceClosure(cell, null, [[x, y]], { knownTotal });
      if (!closure) {
        knownTotal[x * n + y] = 1;
        knownTotal[y * n + x] = 1;
        continue;
      }
      const partition = closurePartition(closure);
      const key = partition.join(",");
      if (!found.has(key)) found.set(key, { closure, partition, pair: [x, y] });
      if (options.first) return { knownTotal, found, complete: false };
    }
  }
  return { knownTotal, found, complete: true };
}
