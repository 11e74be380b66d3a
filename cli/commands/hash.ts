import type { CliIo } from "@/cli/io";
import { CliError, parseOptions, readJsonFile, runCommand } from "@/cli/shared";
import { certificateAddress } from "@/lib/certificate";

/** `hash FILE`: prints the certificate's content address (sha256 of its RFC 8785 canonical form). */
export async function run(args: string[], io: CliIo): Promise<number> {
  return runCommand(io, async () => {
    const { positionals } = parseOptions(args, {});
    if (positionals.length !== 1) throw new CliError("usage: npm run --silent cli -- hash FILE");
    io.out(`${certificateAddress(await readJsonFile(positionals[0]))}\n`);
    return 0;
  });
}
