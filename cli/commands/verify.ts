import { Worker } from "node:worker_threads";
import type { CliIo } from "@/cli/io";
import { CliError, LIMIT_OPTIONS, integerOption, limitFlag, limitsFrom, parseOptions, readTextFile, runCommand } from "@/cli/shared";
import { verifyCertificate, type Limits, type VerifyResult } from "@/lib/verify";

/** Exit codes of `verify`; 3 is an internal error (cli/index.ts). */
export const EXIT = { holds: 0, fails: 1, refused: 2, stopped: 4 } as const;

export const USAGE = `usage: npm run --silent cli -- verify FILE [--deadline MS] [--max-windows N …]
  exit 0  the square holds; prints the content address
  exit 1  the square fails; prints the counterexample as JSON
  exit 2  malformed, or beyond a limit (names the bound and the flag that raises it)
  exit 4  stopped: no verdict within --deadline MS milliseconds (the check was abandoned, nothing is claimed)
  limits: --max-block --max-alphabet --max-states --max-windows --max-digits --max-steps
          --max-entry-digits --max-chain-cost --max-ca-cost --max-text-length --max-nesting`;

/**
 * `verify FILE`: exit 0 and the content address when the certificate holds; exit 1 and the counterexample
 * as JSON when it does not; exit 2 with what is wrong and where when it is malformed or beyond the limits;
 * exit 4 when --deadline passed first.
 */
export async function run(args: string[], io: CliIo): Promise<number> {
  return runCommand(io, async () => {
    const { values, positionals } = parseOptions(args, { ...LIMIT_OPTIONS, deadline: { type: "string" }, help: { type: "boolean" } });
    if (values.help) {
      io.out(`${USAGE}\n`);
      return 0;
    }
    if (positionals.length !== 1) throw new CliError(USAGE);
    const [file] = positionals;
    const deadline = values.deadline === undefined ? null : integerOption(values, "deadline");
    if (deadline === 0) throw new CliError("--deadline must be at least 1 millisecond");
    const text = await readTextFile(file);
    const limits = limitsFrom(values);
    const result = deadline === null ? verifyCertificate(text, limits) : await verifyWithin(text, limits, deadline);
    if (result === "stopped") {
      io.out(`${JSON.stringify({ status: "stopped", deadlineMs: deadline }, null, 2)}\n`);
      io.err(`${file}: stopped: no verdict within ${deadline} ms (--deadline); nothing is claimed about this certificate\n`);
      return EXIT.stopped;
    }
    return report(result, file, io);
  });
}

function report(result: VerifyResult, file: string, io: CliIo): number {
  switch (result.status) {
    case "holds":
      io.out(`${result.address}\n`);
      return EXIT.holds;
    case "fails":
      io.out(`${JSON.stringify({ status: "fails", address: result.address, counterexample: result.counterexample }, null, 2)}\n`);
      return EXIT.fails;
    case "malformed":
      io.out(`${JSON.stringify({ status: "malformed", issues: result.issues }, null, 2)}\n`);
      for (const issue of result.issues) io.err(`${file}: ${issue.path || "(document)"}: ${issue.message}\n`);
      return EXIT.refused;
    case "too-large":
      io.out(`${JSON.stringify(result, null, 2)}\n`);
      io.err(`${file}: too large: ${result.bound} is ${result.limit}, the check asks for ${result.asked} (raise it with ${limitFlag(result.bound)})\n`);
      return EXIT.refused;
  }
}

/** The same check in a worker thread, terminated when the deadline passes first. */
function verifyWithin(text: string, limits: Limits, deadlineMs: number): Promise<VerifyResult | "stopped"> {
  const worker = new Worker(new URL("./verify-worker.mjs", import.meta.url), {
    workerData: { text, limits, module: new URL("../../lib/verify/index.ts", import.meta.url).href },
  });
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => {
      resolve("stopped");
      void worker.terminate();
    }, deadlineMs);
    worker.once("message", (result: VerifyResult) => {
      clearTimeout(timer);
      resolve(result);
      void worker.terminate();
    });
    worker.once("error", (err) => {
      clearTimeout(timer);
      reject(err);
    });
  });
}
