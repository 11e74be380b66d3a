import { parseArgs } from "node:util";
import { CliError } from "./cliError";

export type OptionSpec = Record<string, { type: "string" | "boolean" }>;

/** Strict `--name value` parsing: unknown options and missing values are usage errors (exit 2). */
export function parseOptions(args: string[], options: OptionSpec): { values: Record<string, string | boolean | undefined>; positionals: string[] } {
  try {
    const { values, positionals } = parseArgs({ args, options, allowPositionals: true, strict: true });
    return { values: values as Record<string, string | boolean | undefined>, positionals };
  } catch (e) {
    throw new CliError(e instanceof Error ? e.message : String(e));
  }
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
