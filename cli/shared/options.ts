import { parseArgs } from "node:util";
import { CliError } from "./cliError";

export type OptionSpec = Record<string, { type: "string" | "boolean" }>;

/** Strict `--name value` parsing: unknown options and missing values are usage errors (exit 2). */
export function parseOptions(args: string[], options: OptionSpec): { values: Record<string, string | boolean | undefined>; positionals: string[] } {
  try {
    const { values, positionals } = parseArgs({ args, options, allowPositionals: true, strict: true });
    return { values: values as Record<string, string | boolean | undefined>, positionals };
  } catch (e) {
    throw new CliError(parseArgsMessage(args, e));
  }
}

/** node:util's parseArgs explains a value that starts with "-" over three lines; one line naming the flag and the value instead. */
function parseArgsMessage(args: string[], e: unknown): string {
  const message = e instanceof Error ? e.message : String(e);
  const ambiguous = /^Option '(--[\w-]+)' argument is ambiguous/.exec(message);
  if (ambiguous) {
    const value = args[args.indexOf(ambiguous[1]) + 1];
    return `${ambiguous[1]}: "${value}" is not a valid value (a value may not start with "-")`;
  }
  return message.split("\n")[0];
}

export function requireString(values: Record<string, string | boolean | undefined>, name: string): string {
  const v = values[name];
  if (typeof v !== "string" || v === "") throw new CliError(`--${name} is required`);
  return v;
}

/** A positive integer option; `fallback` when absent. */
export function integerOption(values: Record<string, string | boolean | undefined>, name: string, fallback?: number): number {
  const v = values[name];
  if (v === undefined && fallback !== undefined) return fallback;
  if (typeof v !== "string" || !/^\d+$/.test(v)) throw new CliError(`--${name} must be a non-negative integer${v === undefined ? " (missing)" : `, got "${v}"`}`);
  return Number(v);
}

/** "0,1,0" → [0, 1, 0]. */
export function integerList(text: string, name: string): number[] {
  const parts = text.split(",").map((s) => s.trim());
  if (parts.some((p) => !/^\d+$/.test(p))) throw new CliError(`--${name} must be comma-separated integers such as 0,1,0, got "${text}"`);
  return parts.map(Number);
}
