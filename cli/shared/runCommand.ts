import type { CliIo } from "@/cli/io";
import { CliError, describeError } from "./cliError";

/** Runs a command body; a CliError or a core input error is printed on stderr with its exit code, never a stack trace. */
export async function runCommand(io: CliIo, body: () => Promise<number>): Promise<number> {
  try {
    return await body();
  } catch (e) {
    io.err(`error: ${describeError(e)}\n`);
    return e instanceof CliError ? e.code : 2;
  }
}
