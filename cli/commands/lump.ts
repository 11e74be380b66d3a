import type { CliIo } from "@/cli/io";
import { CliError, integerOption, parseOptions, readMatrixFile, runCommand } from "@/cli/shared";
import { allLumpings, coarsestLumping, MAX_ENUMERATED_STATES } from "@/lib/discovery";
import { formatRational } from "@/lib/rational";
import { progressPrinter } from "./atlas";

const USAGE = `usage: npm run --silent cli -- lump FILE --labels a,b,… [--json] [--deadline-ms MS] [--progress]
       npm run --silent cli -- lump FILE --all [--json]
  The coarsest strongly lumpable partition refining the labels (one label per state; states with different
  labels stay apart), with the lumped chain. --all lists every lumping of a chain of at most ${MAX_ENUMERATED_STATES} states.
  FILE: CSV of rationals or Matrix Market.
`;

const OPTIONS = {
  labels: { type: "string" },
  all: { type: "boolean" },
  json: { type: "boolean" },
  "deadline-ms": { type: "string" },
  progress: { type: "boolean" },
} as const;

/** `lump FILE --labels … [--json]`. */
export async function run(args: string[], io: CliIo): Promise<number> {
  return runCommand(io, async () => {
    if (args.length === 0 || args[0] === "--help") {
      io.err(USAGE);
      return args.length === 0 ? 2 : 0;
    }
    const { values, positionals } = parseOptions(args, OPTIONS);
    if (positionals.length !== 1) throw new CliError(`expected one matrix FILE\n${USAGE}`);
    const matrix = await readMatrixFile(positionals[0]);
    const json = Boolean(values.json);
    if (values.all) {
      if (values.labels !== undefined) throw new CliError("--all lists every lumping; it takes no --labels");
      if (matrix.length > MAX_ENUMERATED_STATES) throw new CliError(`--all enumerates chains of at most ${MAX_ENUMERATED_STATES} states; this one has ${matrix.length}`);
      for (const partition of allLumpings(matrix)) io.out(json ? `${JSON.stringify({ partition, blocks: Math.max(...partition) + 1 })}\n` : `${partition.join(",")}\n`);
      return 0;
    }
    if (typeof values.labels !== "string" || values.labels === "") throw new CliError(`--labels is required (one label per state, e.g. 0,0,1)\n${USAGE}`);
    const labels = values.labels.split(",").map((s) => s.trim());
    if (labels.length !== matrix.length) throw new CliError(`--labels has ${labels.length} entries for a ${matrix.length}-state chain`);
    const deadlineMs = values["deadline-ms"] === undefined ? undefined : integerOption(values, "deadline-ms");
    const result = coarsestLumping({ chain: matrix, labels, deadlineMs, onProgress: values.progress ? progressPrinter(io) : undefined });
    if (result.stopped) {
      io.err(`stopped (${result.stopped})\n`);
      return 1;
    }
    const lumped = result.lumped?.map((row) => row.map(formatRational)) ?? null;
    if (json) io.out(`${JSON.stringify({ partition: result.partition, blocks: result.blocks, lumped })}\n`);
    else {
      io.out(`${result.blocks} blocks: ${result.partition.join(",")}\n`);
      if (lumped) for (const row of lumped) io.out(`${row.join("  ")}\n`);
    }
    return 0;
  });
}
