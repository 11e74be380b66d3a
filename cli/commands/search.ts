import type { CliIo } from "@/cli/io";
import { CliError, integerOption, parseOptions, readJsonFile, runCommand } from "@/cli/shared";
import { searchBinaryProjections, searchCongruences, type RuleOption } from "@/lib/discovery";
import { progressPrinter, projectionLine } from "./atlas";

const USAGE = `usage: npm run --silent cli -- search <projection|congruence> --rule R | --table FILE --block N [--json] [--deadline-ms MS] [--progress]
  projection: every binary projection of the block-N supercell that commutes with some radius-1 binary CA, by target.
  congruence: proper partitions of the block states that are congruences (coarse-grainings onto larger alphabets),
              coarsest first. FILE holds {"k":…, "r":1, "table":[…]}.
  Exit 0 when complete, 1 when stopped by the deadline.
`;

const OPTIONS = {
  rule: { type: "string" },
  table: { type: "string" },
  block: { type: "string" },
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

/** `search projection|congruence --rule R --block N [--json]`. */
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
    const deadlineMs = values["deadline-ms"] === undefined ? undefined : integerOption(values, "deadline-ms");
    const onProgress = values.progress ? progressPrinter(io) : undefined;
    const json = Boolean(values.json);
    const ruleNumber = rule.rule ?? null;
    if (what === "projection") {
      const result = searchBinaryProjections({ ...rule, block, deadlineMs, onProgress });
      if (result.stopped) {
        io.err(`stopped (${result.stopped}) at ${result.coverage.stoppedAt}\n`);
        return 1;
      }
      for (const t of result.targets)
        io.out(json ? `${projectionLine({ rule: ruleNumber, block, ...t })}\n` : `block ${block} → rule ${t.target}: ${t.count} projection(s), e.g. ${t.example}\n`);
      if (!json && result.targets.length === 0) io.out(`no binary projection commutes at block ${block}\n`);
      return 0;
    }
    const limit = values.limit === undefined ? undefined : integerOption(values, "limit");
    const result = searchCongruences({ ...rule, block, deadlineMs, onProgress, limit });
    if (result.stopped) {
      io.err(`stopped (${result.stopped}) at ${result.coverage.stoppedAt}${result.exists ? "; a proper congruence exists" : ""}\n`);
      return 1;
    }
    for (const c of result.congruences)
      io.out(
        json
          ? `${JSON.stringify({ rule: ruleNumber, block, classes: c.classes, partition: c.partition, target: c.target, maximal: c.maximal })}\n`
          : `${c.classes} classes${c.maximal ? " (maximal)" : ""}: ${c.partition.join(",")}\n`,
      );
    if (!json && result.congruences.length === 0) io.out(`no proper congruence at block ${block}\n`);
    return 0;
  });
}
