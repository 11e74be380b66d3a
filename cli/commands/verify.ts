import type { CliIo } from "@/cli/io";
import { CliError, LIMIT_OPTIONS, limitFlag, limitsFrom, parseOptions, readTextFile, runCommand } from "@/cli/shared";
import { verifyCertificate } from "@/lib/verify";

/**
 * `verify FILE`: exit 0 and the content address when the certificate holds; exit 1 and the counterexample
 * as JSON when it does not; exit 2 with what is wrong and where when it is malformed or beyond the limits.
 */
export async function run(args: string[], io: CliIo): Promise<number> {
  return runCommand(io, async () => {
    const { values, positionals } = parseOptions(args, LIMIT_OPTIONS);
    if (positionals.length !== 1) throw new CliError("usage: npm run --silent cli -- verify FILE [--max-windows N …]");
    const [file] = positionals;
    const result = verifyCertificate(await readTextFile(file), limitsFrom(values));
    switch (result.status) {
      case "holds":
        io.out(`${result.address}\n`);
        return 0;
      case "fails":
        io.out(`${JSON.stringify({ status: "fails", address: result.address, counterexample: result.counterexample }, null, 2)}\n`);
        return 1;
      case "malformed":
        io.out(`${JSON.stringify({ status: "malformed", issues: result.issues }, null, 2)}\n`);
        for (const issue of result.issues) io.err(`${file}: ${issue.path || "(document)"}: ${issue.message}\n`);
        return 2;
      case "too-large":
        io.out(`${JSON.stringify(result, null, 2)}\n`);
        io.err(`${file}: too large: ${result.bound} is ${result.limit}, the check asks for ${result.asked} (raise it with ${limitFlag(result.bound)})\n`);
        return 2;
    }
  });
}
