import type { CliIo } from "@/cli/io";
import { CliError, integerOption, parseOptions, readJsonFile, runCommand } from "@/cli/shared";
import { searchBinaryProjections, searchCongruences, type RuleOption } from "@/lib/discovery";
import { progressPrinter } from "./atlas";

const USAGE = `usage: npm run --silent cli -- search <projection|congruence> --rule R | --table FILE --block N [--steps T] [--json] [--deadline-ms MS] [--progress]
  projection: every binary projection of the block-N supercell (T steps, 1 ≤ T ≤ 2N, default N) that commutes with
              some binary CA of radius R = ceil(rT/N), by target. --json: one line per coarse rule,
              {"target":{"k":2,"r":R,"table":[…]},"projections":<count>,"example":"<bits>"}.
  congruence: proper partitions of the block states that are congruences (coarse-grainings onto larger alphabets),
              coarsest first. --json: {"target":{"k":m,"r":R,"table":[…]},"classes":m,"partition":[…],"maximal":bool}.
  FILE holds {"k":…, "r":…, "table":[…]} (a rule of any radius, table index as in DOMAIN.md §1).
  Exit 0 when complete, 1 when stopped by the deadline.
`;

const OPTIONS = {
  rule: { type: "string" },
  table: { type: "string" },
  block: { type: "string" },
  steps: { type: "string" },
  json: { type: "boolean" },
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

/** `search projection|congruence --rule R | --table FILE --block N [--steps T] [--json]`. */
export async function run(args: string[], io: CliIo): Promise<number> {
  return runCommand(io, async () => {
    const [what, ...rest] = args;
    if (!what || what === "--help") {
      io.err(USAGE);
      return what ? 0 : 2;
    }
    if (what !== "projection" && what !== "congruence") throw new CliError(`unknown search "${what}"\n${USAGE}`);
    const { values, positionals } = parseOptions(rest, OPTIONS);
    if (positionals.length > 0) throw new CliError(`unexpected argument "${positionals[0]}"\n${USAGE}`);
    const rule = await ruleOption(values);
    if (values.block === undefined) throw new CliError(`--block is required\n${USAGE}`);
    const block = integerOption(values, "block");
    const steps = values.steps === undefined ? undefined : integerOption(values, "steps");
    const deadlineMs = values["deadline-ms"] === undefined ? undefined : integerOption(values, "deadline-ms");
    const onProgress = values.progress ? progressPrinter(io) : undefined;
    const json = Boolean(values.json);
    if (what === "projection") {
      const result = searchBinaryProjections({ ...rule, block, steps, deadlineMs, onProgress });
      if (result.stopped) {
        io.err(`stopped (${result.stopped}) at ${result.coverage.stoppedAt}\n`);
        return 1;
      }
      const at = `block ${block}, ${result.steps} steps`;
      for (const t of result.targets)
        io.out(
          json
            ? `${JSON.stringify({ target: t.coarse, projections: countJson(t.count), example: t.example })}\n`
            : `${at} → ${t.target !== null ? `rule ${t.target}` : `radius-${t.coarse.r} rule ${t.coarse.table.join("")}`}: ${t.count} projection(s), e.g. ${t.example}\n`,
        );
      if (!json && result.targets.length === 0) io.out(`no binary projection commutes at ${at}\n`);
      return 0;
    }
    const limit = values.limit === undefined ? undefined : integerOption(values, "limit");
    const result = searchCongruences({ ...rule, block, steps, deadlineMs, onProgress, limit });
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
    if (!json && result.congruences.length === 0) io.out(`no proper congruence at block ${block}, ${result.steps} steps\n`);
    return 0;
  });
}
