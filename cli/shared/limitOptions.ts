import { DEFAULT_LIMITS, type Limits } from "@/lib/verify";
import { integerOption, type OptionSpec } from "./options";

const FLAGS: Record<keyof Limits, string> = {
  maxBlock: "max-block",
  maxAlphabet: "max-alphabet",
  maxStates: "max-states",
  maxWindows: "max-windows",
  maxDigits: "max-digits",
  maxSteps: "max-steps",
  maxEntryDigits: "max-entry-digits",
  maxChainCost: "max-chain-cost",
  maxCaCost: "max-ca-cost",
  maxTextLength: "max-text-length",
  maxNesting: "max-nesting",
};

/** --max-block N, --max-windows N, … override DEFAULT_LIMITS. */
export const LIMIT_OPTIONS: OptionSpec = Object.fromEntries(Object.values(FLAGS).map((flag) => [flag, { type: "string" as const }]));

export function limitsFrom(values: Record<string, string | boolean | undefined>): Limits {
  const limits = { ...DEFAULT_LIMITS };
  for (const [key, flag] of Object.entries(FLAGS) as [keyof Limits, string][]) if (values[flag] !== undefined) limits[key] = integerOption(values, flag);
  return limits;
}

export function limitFlag(bound: string): string {
  return `--${FLAGS[bound as keyof Limits] ?? bound}`;
}
