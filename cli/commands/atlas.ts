import type { CliIo } from "@/cli/io";
import { CliError, integerOption, parseOptions, runCommand } from "@/cli/shared";
import { buildEcaAtlas, type EcaAtlas, type PartitionAtlasRow, type ProjectionAtlasRow } from "@/lib/discovery";

const USAGE = `usage: npm run --silent cli -- atlas --max-block N [--partitions] [--json] [--deadline-ms MS] [--progress]
  Binary projections of all 256 ECAs for block sizes 2..N (N ≤ 7), or with --partitions, for each rule the
  smallest block size ≤ N (N ≤ 9) with a proper congruence. --json prints one JSON object per line.
  "projections" is a JSON number, or a decimal string when it exceeds 2^53 (identity-like rules at N ≥ 6).
  Exit 0 when complete, 1 when stopped by the deadline (the lines printed cover the blocks reported on stderr).
`;

const OPTIONS = {
  "max-block": { type: "string" },
  partitions: { type: "boolean" },
  json: { type: "boolean" },
  "deadline-ms": { type: "string" },
  progress: { type: "boolean" },
  help: { type: "boolean" },
} as const;

/** Progress on stderr, at most every half second, so that stdout stays machine-readable. */
export function progressPrinter(io: CliIo): (fraction: number, item: string) => void {
  let last = 0;
  return (fraction, item) => {
    const now = Date.now();
    if (now - last < 500 && fraction < 1) return;
    last = now;
    io.err(`progress ${(fraction * 100).toFixed(1)}% ${item}\n`);
  };
}

function countJson(count: bigint): number | string {
  return count <= BigInt(Number.MAX_SAFE_INTEGER) ? Number(count) : count.toString();
}

export function projectionLine(row: { rule: number | null; block: number; target: number; count: bigint; example: string }): string {
  return JSON.stringify({ rule: row.rule, block: row.block, target: row.target, projections: countJson(row.count), example: row.example });
}

function partitionLine(row: PartitionAtlasRow): string {
  return JSON.stringify({ rule: row.rule, block: row.block, classes: row.classes, partition: row.partition, target: row.target });
}

function textProjection(row: ProjectionAtlasRow): string {
  return `rule ${row.rule} (class ${row.symmetryClass}) block ${row.block} → rule ${row.target}: ${row.count} projection(s), e.g. ${row.example}`;
}

function textPartition(row: PartitionAtlasRow): string {
  return row.block === null
    ? `rule ${row.rule} (class ${row.symmetryClass}): none`
    : `rule ${row.rule} (class ${row.symmetryClass}): block ${row.block}, ${row.classes} classes${row.maximal ? " (maximal)" : ""}, projection ${row.partition?.join("")}`;
}

/** "98 rules at N=2, 64 at N=3, …; 16 rules (4 classes) have none up to N=7". */
export function smallestBlockHeadline(rows: PartitionAtlasRow[], maxBlock: number): string {
  const byBlock = new Map<number, number>();
  let none = 0;
  const noneClasses = new Set<number>();
  for (const row of rows) {
    if (row.block === null) {
      none++;
      noneClasses.add(row.symmetryClass);
    } else byBlock.set(row.block, (byBlock.get(row.block) ?? 0) + 1);
  }
  const parts = [...byBlock].sort((a, b) => a[0] - b[0]).map(([N, c]) => `${c} at N=${N}`);
  return `smallest block with a proper coarse-graining: ${parts.join(", ")}; ${none} rules (${noneClasses.size} symmetry classes: ${[...noneClasses].sort((a, b) => a - b).join(", ")}) have none up to N=${maxBlock}`;
}

function printAtlas(atlas: EcaAtlas, json: boolean, io: CliIo, maxBlock: number): void {
  if (atlas.kind === "projections") {
    for (const row of atlas.rows) io.out(`${json ? projectionLine(row) : textProjection(row)}\n`);
  } else {
    for (const row of atlas.rows) io.out(`${json ? partitionLine(row) : textPartition(row)}\n`);
    if (!json) io.out(`${smallestBlockHeadline(atlas.rows, maxBlock)}\n`);
  }
}

/** `atlas --max-block N [--partitions] [--json]`. */
export async function run(args: string[], io: CliIo): Promise<number> {
  return runCommand(io, async () => {
    const { values, positionals } = parseOptions(args, OPTIONS);
    if (values.help) {
      io.err(USAGE);
      return 0;
    }
    if (positionals.length > 0) throw new CliError(`unexpected argument "${positionals[0]}"\n${USAGE}`);
    if (values["max-block"] === undefined) throw new CliError(`--max-block is required\n${USAGE}`);
    const maxBlock = integerOption(values, "max-block");
    const kind = values.partitions ? "partitions" : "projections";
    const deadlineMs = values["deadline-ms"] === undefined ? undefined : integerOption(values, "deadline-ms");
    const atlas = buildEcaAtlas({ kind, maxBlock, deadlineMs, onProgress: values.progress ? progressPrinter(io) : undefined });
    printAtlas(atlas, Boolean(values.json), io, maxBlock);
    if (atlas.stopped) {
      const covered = atlas.coverage.blocks;
      io.err(`stopped (${atlas.stopped}) at ${atlas.coverage.stoppedAt}; complete for block sizes: ${covered.length ? covered.join(", ") : "none"}\n`);
      return 1;
    }
    return 0;
  }, { maxBlock: "--max-block", minBlock: "--max-block" });
}
