// Runs in a job worker thread: lib/ only. Turns search results into certificates to submit and
// search records to store (what was searched, so that negative results are kept too).
import { certifyProjection, type Certificate } from "@/lib/certificate";
import type { BinaryProjectionTarget, Coverage, PartitionAtlasRow, ProjectionAtlasRow } from "@/lib/discovery";
import { canonicalModel, modelAddress } from "@/lib/models";

export type Finding = { rule: number; what: string; certificate: Certificate };

/** A search_records row before it has a model id: one per rule and search kind. */
export type RecordDraft = {
  rule: number;
  kind: "binary-projections" | "congruences";
  maxBlock: number | null;
  algorithm: string;
  algorithmVersion: string;
  coverage: Record<string, unknown>;
  outcome: { targets: string[] } & Record<string, unknown>;
};

export type CaFindings = { findings: Finding[]; records: RecordDraft[]; skipped: string[] };

const ecaAddress = (rule: number) => modelAddress(canonicalModel({ kind: "eca", rule }));

/** The search record of a complete binary-projection search of one rule: what was covered, and what it found. */
function projectionRecord(rule: number, coverage: Coverage, steps: number | "T = N", targetKinds: string[], outcome: RecordDraft["outcome"]): RecordDraft {
  return {
    rule,
    kind: "binary-projections",
    maxBlock: Math.max(...coverage.blocks),
    algorithm: coverage.algorithm,
    algorithmVersion: coverage.version,
    coverage: { rule, blocks: coverage.blocks, steps, coarseAlphabet: 2, targetKinds, exhaustive: true },
    outcome,
  };
}

function certify(rule: number, block: number, projection: string | number[], what: string, out: CaFindings, steps = block): void {
  const built = certifyProjection({ rule, block, steps, projection });
  // The search and the checker are separate programs; a disagreement is reported, never stored.
  if (built.ok) out.findings.push({ rule, what, certificate: built.certificate });
  else out.skipped.push(`${what}: the checker found a counterexample`);
}

/**
 * Binary projections: one certificate per (rule, block, target) with the search's example
 * projection, and per rule a record of the block sizes covered and every target reached there.
 */
export function projectionFindings(rows: ProjectionAtlasRow[], rules: number[], coverage: Coverage, out: CaFindings): void {
  const covered = new Set(coverage.blocks);
  const targets = new Map<number, Map<number, { block: number; count: string }[]>>();
  for (const row of rows) {
    certify(row.rule, row.block, row.example, `rule ${row.rule} → rule ${row.target} at block ${row.block}`, out);
    if (!covered.has(row.block)) continue;
    const byTarget = targets.get(row.rule) ?? new Map();
    byTarget.set(row.target, [...(byTarget.get(row.target) ?? []), { block: row.block, count: row.count.toString() }]);
    targets.set(row.rule, byTarget);
  }
  if (coverage.blocks.length === 0) return;
  for (const rule of rules) {
    const found = [...(targets.get(rule) ?? new Map<number, { block: number; count: string }[]>()).entries()].sort((a, b) => a[0] - b[0]);
    out.records.push(
      projectionRecord(rule, coverage, "T = N", ["eca"], {
        targets: found.map(([target]) => ecaAddress(target)),
        byTarget: found.map(([target, where]) => ({ target, blocks: where })),
      }),
    );
  }
}

/**
 * Congruences (partitions of the block states): the smallest block with a proper congruence per
 * rule, certified as a projection onto the classes. A record of "none up to block N" rules out every
 * partition coarse-graining at those sizes; a found one does not rule out other targets.
 */
export function partitionFindings(rows: PartitionAtlasRow[], minBlock: number, coverage: Coverage, out: CaFindings, steps?: number): void {
  const maxCovered = coverage.blocks.length ? Math.max(...coverage.blocks) : null;
  for (const row of rows) {
    let target: string | null = null;
    if (row.block !== null && row.partition) {
      const before = out.findings.length;
      const at = steps === undefined ? "" : `, ${steps} steps`;
      certify(row.rule, row.block, row.partition, `rule ${row.rule}: ${row.classes} classes at block ${row.block}${at}`, out, steps ?? row.block);
      if (out.findings.length > before) target = modelAddress(out.findings[out.findings.length - 1].certificate.target);
    }
    const searchedTo = row.block ?? maxCovered;
    if (searchedTo === null) continue;
    const blocks = Array.from({ length: searchedTo - minBlock + 1 }, (_, i) => minBlock + i);
    out.records.push({
      rule: row.rule,
      kind: "congruences",
      maxBlock: searchedTo,
      algorithm: coverage.algorithm,
      algorithmVersion: coverage.version,
      // with T apart from N the record names no target kinds: Ask answers for T = N (see stepsProjectionFindings)
      coverage: { rule: row.rule, blocks, steps: steps ?? "T = N", targetKinds: row.block === null && steps === undefined ? ["ca", "eca"] : [], exhaustive: row.block === null },
      outcome: {
        targets: target ? [target] : [],
        properCongruence: row.block !== null,
        ...(row.block !== null ? { smallestBlock: row.block, classes: row.classes, maximal: row.maximal, partition: row.partition } : {}),
      },
    });
  }
}

export type StepsProjectionRow = { block: number; targets: BinaryProjectionTarget[] };

/**
 * Binary projections with T steps apart from the block size (DOMAIN.md §2b): one certificate per (block, coarse rule),
 * radius ⌈T/N⌉, and one record of the blocks covered at these T steps. The record names no target kinds, so that Ask,
 * which answers for T = N, never reads a "no" from it; it stays citable on the model's page and in the export.
 */
export function stepsProjectionFindings(rule: number, steps: number, rows: StepsProjectionRow[], coverage: Coverage, out: CaFindings): void {
  const byTarget = new Map<string, { target: BinaryProjectionTarget["coarse"]; blocks: { block: number; count: string }[] }>();
  for (const { block, targets } of rows)
    for (const t of targets) {
      const before = out.findings.length;
      certify(rule, block, t.example, `rule ${rule} → ${t.target !== null ? `rule ${t.target}` : `radius-${t.coarse.r} rule`} at block ${block}, ${steps} steps`, out, steps);
      if (out.findings.length === before) continue;
      const address = modelAddress(out.findings[out.findings.length - 1].certificate.target);
      const had = byTarget.get(address) ?? { target: t.coarse, blocks: [] };
      had.blocks.push({ block, count: t.count.toString() });
      byTarget.set(address, had);
    }
  if (coverage.blocks.length === 0) return;
  out.records.push(projectionRecord(rule, coverage, steps, [], { targets: [...byTarget.keys()], byTarget: [...byTarget.values()] }));
}
