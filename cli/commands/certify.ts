import type { CliIo } from "@/cli/io";
import type { FieldFlags } from "@/cli/shared/cliError";
import { CliError, LIMIT_OPTIONS, integerList, integerOption, limitFlag, limitsFrom, parseOptions, readJsonFile, readMatrixFile, requireString, runCommand } from "@/cli/shared";
import { canonicalModel, type Model } from "@/lib/models";
import { formatMatrix } from "@/lib/markov";
import {
  CERTIFICATE_FORMAT,
  CERTIFICATE_VERSION,
  certificateText,
  certifyBlocking,
  certifyDecimation,
  certifyExactLumping,
  certifyIterate,
  certifyLumping,
  certifyProjection,
  parseProjectionString,
  type Built,
  type CertificateMap,
  type RuleInput,
} from "@/lib/certificate";
import { ecaTable } from "@/lib/ca";
import { exceededLimit, fullLimits, type Limits } from "@/lib/verify";

const USAGE = `usage: npm run --silent cli -- certify <map> [options]
  projection --rule R | --table FILE  --block N [--steps T] --projection BITS
  lumping    --matrix FILE [--labels a,b,…] --partition 0,1,0,… [--steps S] [--exact]
             (--exact: exact lumpability, equal column sums into each block; Buchholz 1994)
  decimation --matrix FILE [--labels a,b,…] --steps K
  blocking   --rule R | --table FILE  --block N [--steps T]
  iterate    --rule R | --table FILE  --steps T
Prints the certificate (exit 0), or the counterexample as JSON (exit 1); bad input exits 2.
`;

const OPTIONS = {
  rule: { type: "string" },
  table: { type: "string" },
  block: { type: "string" },
  steps: { type: "string" },
  projection: { type: "string" },
  matrix: { type: "string" },
  labels: { type: "string" },
  partition: { type: "string" },
  exact: { type: "boolean" },
  ...LIMIT_OPTIONS,
} as const;

type Values = Record<string, string | boolean | undefined>;

/** `certify <map> …`: runs the check and prints the sealed certificate (exit 0) or the counterexample (exit 1). */
export async function run(args: string[], io: CliIo): Promise<number> {
  const flags: FieldFlags = {};
  return runCommand(io, async () => {
    const [map, ...rest] = args;
    if (!map || map === "--help") {
      io.err(USAGE);
      return map ? 0 : 2;
    }
    const { values, positionals } = parseOptions(rest, OPTIONS);
    Object.assign(flags, certifyFlags(values));
    if (positionals.length > 0) throw new CliError(`unexpected argument "${positionals[0]}"\n${USAGE}`);
    const limits = limitsFrom(values);
    const built = await build(map, values, limits);
    if (!built.ok) {
      io.out(`${JSON.stringify({ status: "fails", counterexample: built.counterexample }, null, 2)}\n`);
      return 1;
    }
    io.out(`${certificateText(built.certificate)}\n`);
    return 0;
  }, flags);
}

/** The core's field names as this command's flags, so that "partition: …" from lib/ reads "--partition: …". */
function certifyFlags(values: Values): FieldFlags {
  const file = (flag: string) => (typeof values[flag] === "string" ? `--${flag} ${values[flag]}` : `--${flag}`);
  return { partition: "--partition", labels: "--labels", steps: "--steps", block: "--block", projection: "--projection", rule: "--rule", matrix: file("matrix"), k: `${file("table")}: k`, r: `${file("table")}: r`, table: `${file("table")}: table` };
}

async function build(map: string, values: Values, limits: Limits): Promise<Built<unknown>> {
  switch (map) {
    case "projection": {
      const rule = await ruleInput(values);
      const block = integerOption(values, "block");
      const steps = integerOption(values, "steps", block);
      const projection = parseProjectionString(requireString(values, "projection"));
      precheck({ kind: "projection", block, steps, projection }, caModel(rule), limits);
      return certifyProjection({ ...rule, block, steps, projection });
    }
    case "blocking": {
      const rule = await ruleInput(values);
      const block = integerOption(values, "block");
      const steps = integerOption(values, "steps", block);
      precheck({ kind: "blocking", block, steps }, caModel(rule), limits);
      return certifyBlocking({ ...rule, block, steps });
    }
    case "iterate": {
      const rule = await ruleInput(values);
      const steps = integerOption(values, "steps");
      precheck({ kind: "iterate", steps }, caModel(rule), limits);
      return certifyIterate({ ...rule, steps });
    }
    case "lumping": {
      const chain = await chainInput(values, limits);
      const partition = integerList(requireString(values, "partition"), "partition");
      const steps = integerOption(values, "steps", 1);
      const kind = values.exact ? "exact-lumping" : "lumping";
      precheck({ kind, partition, steps }, chain, limits);
      return (values.exact ? certifyExactLumping : certifyLumping)({ chain, partition, steps });
    }
    case "decimation": {
      const chain = await chainInput(values, limits);
      const steps = integerOption(values, "steps");
      precheck({ kind: "decimation", steps }, chain, limits);
      return certifyDecimation({ chain, steps });
    }
    default:
      throw new CliError(`unknown map "${map}"\n${USAGE}`);
  }
}

async function ruleInput(values: Values): Promise<RuleInput> {
  if (values.rule !== undefined && values.table !== undefined) throw new CliError("give --rule or --table, not both");
  if (values.rule !== undefined) {
    const rule = integerOption(values, "rule");
    ecaTable(rule);
    return { rule };
  }
  if (typeof values.table !== "string") throw new CliError("--rule R or --table FILE is required");
  const model = canonicalModel({ ...((await readJsonFile(values.table)) as object), kind: "ca" });
  if (model.kind === "eca") return { rule: model.rule };
  if (model.kind === "ca") return { table: model };
  throw new CliError(`${values.table}: expected {"k": …, "r": …, "table": […]}`);
}

function caModel(rule: RuleInput): Model {
  return rule.rule !== undefined ? { kind: "eca", rule: rule.rule } : canonicalModel({ kind: "ca", k: rule.table!.k, r: rule.table!.r, table: Array.from(rule.table!.table) });
}

/** The chain of --matrix, every entry's digits bounded on the file's text before the number is read. */
async function chainInput(values: Values, limits: Limits): Promise<Model> {
  const matrix = formatMatrix(await readMatrixFile(requireString(values, "matrix"), { maxEntryDigits: fullLimits(limits).maxEntryDigits }));
  const labels = typeof values.labels === "string" ? values.labels.split(",").map((s) => s.trim()) : undefined;
  return canonicalModel({ kind: "markov", labels, matrix });
}

/** Refuses, before any work, a map whose check would exceed the limits (the same bounds `verify` applies). */
function precheck(map: CertificateMap, source: Model, limits: Limits): void {
  const exceeded = exceededLimit({ format: CERTIFICATE_FORMAT, version: CERTIFICATE_VERSION, map, source, target: source }, limits);
  if (exceeded) throw new CliError(`too large: ${exceeded.bound} is ${exceeded.limit}, this asks for ${exceeded.asked} (raise it with ${limitFlag(exceeded.bound)})`);
}
