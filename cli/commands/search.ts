import type { CliIo } from "@/cli/io";
import { CliError, integerOption, parseOptions, readJsonFile, runCommand } from "@/cli/shared";
import { MAX_LISTED_CONGRUENCE_STATES, searchAllCongruences, searchBinaryProjections, searchCongruences, type Congruence, type RuleOption } from "@/lib/discovery";
import type { FieldFlags } from "@/cli/shared/cliError";
import { progressPrinter } from "./atlas";

const USAGE = `usage: npm run --silent cli -- search <projection|congruence> --rule R | --table FILE --block N [--steps T] [--json] [--deadline-ms MS] [--progress]
  projection: every binary projection of the block-N supercell (T steps, 1 ≤ T ≤ 2N, default N) that commutes with
              some binary CA of radius R = ceil(rT/N), by target. --json: one line per coarse rule,
              {"target":{"k":2,"r":R,"table":[…]},"projections":<count>,"example":"<bits>"}.
  congruence: proper partitions of the block states that are congruences (coarse-grainings onto larger alphabets).
              --json: likewise one line per coarse rule, {"target":{"k":m,"r":R,"table":[…]},"projections":<count>,
              "example":"<partition>"}, the partition written as one base-36 digit per block state (as certify projection
              --projection reads it). Up to ${MAX_LISTED_CONGRUENCE_STATES} block states every congruence is counted; beyond, the principal and
              maximal ones are (stderr says so). --each [--limit L]: one line per congruence instead,
              {"target":…,"classes":m,"partition":[…],"maximal":bool}, coarsest first (at most L, default 50).
  FILE holds {"k":…, "r":…, "table":[…]} (a rule of any radius, table index as in DOMAIN.md §1).
  Exit 0 when complete, 1 when stopped by the deadline.
`;

const OPTIONS = {
  rule: { type: "string" },
  table: { type: "string" },
  block: { type: "string" },
  steps: { type: "string" },
  json: { type: "boolean" },
  each: { type: "boolean" },
  limit: { type: "string" },
  "deadline-ms": { type: "string" },
  progress: { type: "boolean" },
} as const;

async function ruleOption(values: Record<string, string | boolean | undefined>): Promise<RuleOption> {
  if (values.rule !== undefined && values.table !== undefined) throw new CliError("give either --rule or --table, not both");
  if (values.rule !== undefined) {
    const rule = integerOption(values, "rule");
    if (rule > 255) throw new CliError(`--rule must be an ECA rule number 0..255, got ${rule}`);
    return { rule };
  }
  if (typeof values.table === "string") {
    const t = (await readJsonFile(values.table)) as { k?: unknown; r?: unknown; table?: unknown };
    if (typeof t !== "object" || t === null || typeof t.k !== "number" || typeof t.r !== "number" || !Array.isArray(t.table))
      throw new CliError(`${values.table}: expected {"k": number, "r": number, "table": [numbers]}`);
    return { table: { k: t.k, r: t.r, table: t.table as number[] } };
  }
  throw new CliError(`--rule or --table is required\n${USAGE}`);
}

/** A count as a JSON number, or a decimal string above 2^53. */
function countJson(count: bigint): number | string {
  return count <= BigInt(Number.MAX_SAFE_INTEGER) ? Number(count) : count.toString();
}

/** The core's field names as this command's flags, so that "block: …" from lib/ reads "--block: …". */
function searchFlags(values: Record<string, string | boolean | undefined>): FieldFlags {
  const file = typeof values.table === "string" ? `--table ${values.table}` : "--table";
  return { block: "--block", steps: "--steps", rule: "--rule", limit: "--limit", k: `${file}: k`, r: `${file}: r`, table: `${file}: table` };
}

/** `search projection|congruence --rule R | --table FILE --block N [--steps T] [--json]`. */
export async function run(args: string[], io: CliIo): Promise<number> {
  const [what, ...rest] = args;
  const flags: FieldFlags = {};
  return runCommand(
    io,
    async () => {
      if (!what || what === "--help") {
        io.err(USAGE);
        return what ? 0 : 2;
      }
      if (what !== "projection" && what !== "congruence") throw new CliError(`unknown search "${what}"\n${USAGE}`);
      const { values, positionals } = parseOptions(rest, OPTIONS);
      Object.assign(flags, searchFlags(values));
      if (positionals.length > 0) throw new CliError(`unexpected argument "${positionals[0]}"\n${USAGE}`);
      const rule = await ruleOption(values);
      if (values.block === undefined) throw new CliError(`--block is required\n${USAGE}`);
      const common = {
        ...rule,
        block: integerOption(values, "block"),
        steps: values.steps === undefined ? undefined : integerOption(values, "steps"),
        deadlineMs: values["deadline-ms"] === undefined ? undefined : integerOption(values, "deadline-ms"),
        onProgress: values.progress ? progressPrinter(io) : undefined,
      };
      const json = Boolean(values.json);
      if (what === "projection") return projections(common, json, io);
      if (values.each) return eachCongruence(common, json, limitOption(values), io);
      if (values.limit !== undefined) throw new CliError("--limit bounds the lines of --each; without --each every coarse rule is printed");
      return congruencesByTarget(common, json, io);
    },
    flags,
  );
}

type SearchInput = RuleOption & { block: number; steps?: number; deadlineMs?: number; onProgress?: ReturnType<typeof progressPrinter> };

function projections(input: SearchInput, json: boolean, io: CliIo): number {
  const result = searchBinaryProjections(input);
  if (result.stopped) {
    io.err(`stopped (${result.stopped}) at ${result.coverage.stoppedAt}\n`);
    return 1;
  }
  const at = `block ${input.block}, ${result.steps} steps`;
  for (const t of result.targets)
    io.out(
      json
        ? `${JSON.stringify({ target: t.coarse, projections: countJson(t.count), example: t.example })}\n`
        : `${at} → ${t.target !== null ? `rule ${t.target}` : `radius-${t.coarse.r} rule ${t.coarse.table.join("")}`}: ${t.count} projection(s), e.g. ${t.example}\n`,
    );
  if (!json && result.targets.length === 0) io.out(`no binary projection commutes at ${at}\n`);
  return 0;
}

function limitOption(values: Record<string, string | boolean | undefined>): number | undefined {
  if (values.limit === undefined) return undefined;
  const limit = integerOption(values, "limit");
  // --limit 0 would print nothing and read as "no congruence"
  if (limit < 1) throw new CliError(`--limit must be at least 1, got ${limit}`);
  return limit;
}

/** A partition as one base-36 digit per block state (the --projection text of certify), or comma-separated past 36 classes. */
function partitionText(partition: number[]): string {
  return partition.every((b) => b < 36) ? partition.map((b) => b.toString(36)).join("") : partition.join(",");
}

/** Every proper congruence where the lattice can be listed whole, else the principal and maximal ones (said on stderr). */
function listCongruences(input: SearchInput, io: CliIo): { stopped: string | null; congruences: Congruence[] } {
  const k = input.rule !== undefined ? 2 : (input.table?.k ?? 2);
  if (k ** input.block <= MAX_LISTED_CONGRUENCE_STATES) return searchAllCongruences(input);
  const result = searchCongruences({ ...input, limit: Infinity });
  if (!result.stopped) io.err(`${k ** input.block} block states: counted over the principal and maximal congruences (every congruence is counted up to ${MAX_LISTED_CONGRUENCE_STATES} block states)\n`);
  return { stopped: result.stopped ? `${result.stopped}${result.exists ? "; a proper congruence exists" : ""}` : null, congruences: result.congruences };
}

/** One line per coarse rule, as for projections: how many congruences give it, and the coarsest one as the example. */
function congruencesByTarget(input: SearchInput, json: boolean, io: CliIo): number {
  const result = listCongruences(input, io);
  if (result.stopped) {
    io.err(`stopped (${result.stopped})\n`);
    return 1;
  }
  const byTarget = new Map<string, { target: { k: number; r: number; table: number[] }; count: number; example: number[] }>();
  for (const c of result.congruences) {
    const target = { k: c.classes, r: c.radius, table: c.target };
    const key = JSON.stringify(target);
    const had = byTarget.get(key);
    if (had) had.count++;
    else byTarget.set(key, { target, count: 1, example: c.partition });
  }
  for (const t of byTarget.values())
    io.out(
      json
        ? `${JSON.stringify({ target: t.target, projections: t.count, example: partitionText(t.example) })}\n`
        : `${t.target.k} classes, radius ${t.target.r}: ${t.count} partition(s), e.g. ${partitionText(t.example)}\n`,
    );
  if (!json && byTarget.size === 0) io.out(`no proper congruence at block ${input.block}, ${input.steps ?? input.block} steps\n`);
  return 0;
}

function eachCongruence(input: SearchInput, json: boolean, limit: number | undefined, io: CliIo): number {
  const result = searchCongruences({ ...input, limit });
  if (result.stopped) {
    io.err(`stopped (${result.stopped}) at ${result.coverage.stoppedAt}${result.exists ? "; a proper congruence exists" : ""}\n`);
    return 1;
  }
  for (const c of result.congruences)
    io.out(
      json
        ? `${JSON.stringify({ target: { k: c.classes, r: c.radius, table: c.target }, classes: c.classes, partition: c.partition, maximal: c.maximal })}\n`
        : `${c.classes} classes${c.maximal ? " (maximal)" : ""}: ${c.partition.join(",")}\n`,
    );
  if (!json && result.congruences.length === 0) io.out(`no proper congruence at block ${input.block}, ${result.steps} steps\n`);
  return 0;
}
