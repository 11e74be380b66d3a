import type { CliIo } from "@/cli/io";
import { CliError, integerOption, parseOptions, readMatrixFile, runCommand } from "@/cli/shared";
import { allLumpings, coarsestLumping, MAX_ENUMERATED_STATES, MAX_SPARSE_STATES, readSparseMatrixMarket, type ChainInput } from "@/lib/discovery";
import { readFile } from "node:fs/promises";
import { describeError, type FieldFlags } from "@/cli/shared/cliError";
import { formatRational } from "@/lib/rational";
import { progressPrinter } from "./atlas";

const USAGE = `usage: npm run --silent cli -- lump FILE --labels a,b,… [--json] [--deadline-ms MS] [--progress]
       npm run --silent cli -- lump FILE --exact [--labels a,b,…] [--json]
       npm run --silent cli -- lump FILE --all [--exact] [--json]
  The coarsest strongly lumpable partition refining the labels (one label per state; states with different
  labels stay apart), with the lumped chain. --exact: the coarsest exactly lumpable one (equal column sums,
  Buchholz 1994); without --labels every state starts in one block. --all lists every lumping (with --exact, every exact one) of a chain of at most
  ${MAX_ENUMERATED_STATES} states. FILE: CSV of rationals or Matrix Market (a coordinate file is read sparse, up to
  ${MAX_SPARSE_STATES.toLocaleString("en")} states).
`;

const OPTIONS = {
  labels: { type: "string" },
  all: { type: "boolean" },
  exact: { type: "boolean" },
  json: { type: "boolean" },
  "deadline-ms": { type: "string" },
  progress: { type: "boolean" },
} as const;

/** `lump FILE --labels … [--json]`. */
export async function run(args: string[], io: CliIo): Promise<number> {
  // the chain's own checks name "matrix"; here the matrix is the FILE argument
  const flags: FieldFlags = { labels: "--labels", partition: "--labels" };
  return runCommand(io, async () => {
    if (args.length === 0 || args[0] === "--help") {
      io.err(USAGE);
      return args.length === 0 ? 2 : 0;
    }
    const { values, positionals } = parseOptions(args, OPTIONS);
    if (positionals.length !== 1) throw new CliError(`expected one matrix FILE\n${USAGE}`);
    flags.matrix = positionals[0];
    const json = Boolean(values.json);
    if (values.all) {
      const matrix = await readMatrixFile(positionals[0]);
      if (values.labels !== undefined) throw new CliError("--all lists every lumping; it takes no --labels");
      if (matrix.length > MAX_ENUMERATED_STATES) throw new CliError(`--all enumerates chains of at most ${MAX_ENUMERATED_STATES} states; this one has ${matrix.length}`);
      for (const partition of allLumpings(matrix, { exact: Boolean(values.exact) })) io.out(json ? `${JSON.stringify({ partition, blocks: Math.max(...partition) + 1 })}\n` : `${partition.join(",")}\n`);
      return 0;
    }
    const exact = Boolean(values.exact);
    if (!exact && (typeof values.labels !== "string" || values.labels === "")) throw new CliError(`--labels is required (one label per state, e.g. 0,0,1)\n${USAGE}`);
    const chain = await readChain(positionals[0]);
    const size = Array.isArray(chain) ? chain.length : chain.size;
    const labels = typeof values.labels === "string" && values.labels !== "" ? values.labels.split(",").map((s) => s.trim()) : new Array<string>(size).fill("");
    if (labels.length !== size) throw new CliError(`--labels has ${labels.length} entries for a ${size}-state chain`);
    const deadlineMs = values["deadline-ms"] === undefined ? undefined : integerOption(values, "deadline-ms");
    const result = coarsestLumping({ chain, labels, exact, deadlineMs, onProgress: values.progress ? progressPrinter(io) : undefined });
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
  }, flags);
}

/** A Matrix Market coordinate file is read sparse (large chains); anything else through the core's dense reader. */
async function readChain(path: string): Promise<ChainInput> {
  let text: string;
  try {
    text = await readFile(path, "utf8");
  } catch (e) {
    throw new CliError(`${path}: ${describeError(e)}`);
  }
  if (!/^%%MatrixMarket\s+matrix\s+coordinate\s+(real|integer)\s+general/i.test(text)) return readMatrixFile(path);
  try {
    return readSparseMatrixMarket(text);
  } catch (e) {
    throw new CliError(`${path}: ${describeError(e)}`);
  }
}
