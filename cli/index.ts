/**
 * Squarely's command line: `npm run --silent cli -- <command> …`.
 * Each command lives in cli/commands/<command>.ts and exports `run(args, io)` returning the exit code,
 * so that tests call commands in-process with captured output.
 */
import type { CliIo } from "./io";
import { processIo } from "./io";

const COMMANDS: Record<string, string> = {
  certify: "./commands/certify.ts",
  verify: "./commands/verify.ts",
  compose: "./commands/compose.ts",
  hash: "./commands/hash.ts",
  atlas: "./commands/atlas.ts",
  lump: "./commands/lump.ts",
  search: "./commands/search.ts",
};

export async function main(argv: string[], io: CliIo): Promise<number> {
  const [command, ...args] = argv;
  if (!command || command === "--help" || command === "help" || !(command in COMMANDS)) {
    io.err(`usage: npm run --silent cli -- <${Object.keys(COMMANDS).join("|")}> [options]\n`);
    return command && command !== "--help" && command !== "help" ? 2 : 0;
  }
  const mod = (await import(COMMANDS[command])) as { run: (args: string[], io: CliIo) => Promise<number> | number };
  return mod.run(args, io);
}

if (import.meta.url === `file://${process.argv[1]}`) {
  // exit only once stdout has flushed: process.exit right after a large write to a pipe cuts the output short
  const exitAfterFlush = (code: number) => process.stdout.write("", () => process.exit(code));
  main(process.argv.slice(2), processIo).then(
    (code) => exitAfterFlush(code),
    (err: unknown) => {
      process.stderr.write(`internal error: ${err instanceof Error ? err.message : String(err)}\n`);
      process.exit(3);
    },
  );
}
