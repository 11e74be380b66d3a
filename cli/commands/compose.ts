import type { CliIo } from "@/cli/io";
import { CliError, LIMIT_OPTIONS, describeError, limitsFrom, parseOptions, readTextFile, runCommand } from "@/cli/shared";
import { canonicalCertificate, certificateText, type Certificate } from "@/lib/certificate";
import { composeChain } from "@/lib/chain";
import { readCertificateText } from "@/lib/verify";

/**
 * `compose FILE FILE …`: prints the composite certificate (exit 0; how it was verified goes to stderr),
 * or says which link does not meet the next (exit 1). A file that is not a certificate exits 2.
 */
export async function run(args: string[], io: CliIo): Promise<number> {
  return runCommand(io, async () => {
    const { values, positionals: files } = parseOptions(args, LIMIT_OPTIONS);
    if (files.length === 0) throw new CliError("usage: npm run --silent cli -- compose FILE FILE …");
    const certs: Certificate[] = [];
    const limits = limitsFrom(values);
    for (const file of files) {
      // The raw bounds (digits, nesting, duplicate names) before any number is read, as `verify` does.
      const read = readCertificateText(await readTextFile(file), limits);
      if (!read.ok)
        throw new CliError(`${file}: ${read.verdict.status === "malformed" ? read.verdict.issues.map((i) => `${i.path || "(document)"}: ${i.message}`).join("; ") : `too large: ${read.verdict.bound} is ${read.verdict.limit}, the file asks for ${read.verdict.asked}`}`);
      try {
        certs.push(canonicalCertificate(read.value));
      } catch (e) {
        throw new CliError(e instanceof CliError ? e.message : `${file}: ${describeError(e)}`);
      }
    }
    const result = composeChain(certs, limits);
    if (!result.ok) {
      const where = result.link >= 0 ? ` (${files[result.link]})` : "";
      io.err(`link ${result.link >= 0 ? result.link + 1 : "composite"}${where}: ${result.reason}\n`);
      return 1;
    }
    io.err(`verified: ${result.verification === "links+composite" ? "each link, and the composite directly" : "each link (the composite is beyond the limits for a direct check)"}\n`);
    io.out(`${certificateText(result.composite)}\n`);
    return 0;
  });
}
