import type { CliIo } from "@/cli/io";
import { CliError, describeError, type FieldFlags } from "./cliError";

/**
 * Runs a command body; a CliError or a core input error is printed on stderr as one line with its exit code,
 * never a stack trace. `flags` names the core's fields by the flags that carried them.
 */
export async function runCommand(io: CliIo, body: () => Promise<number>, flags: FieldFlags = {}): Promise<number> {
  try {
    return await body();
  } catch (e) {
    io.err(`error: ${oneLine(describeError(e, flags))}\n`);
    return e instanceof CliError ? e.code : 2;
  }
}

/** The error on one line; a usage text after it is left to `--help`, so the line a script reads is the error. */
function oneLine(message: string): string {
  const [first, ...rest] = message.split("\n");
  if (rest.length === 0) return first;
  return rest[0].startsWith("usage:") ? `${first} (--help prints the usage)` : [first, ...rest].filter(Boolean).join("; ");
}
