import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { captureIo } from "@/cli/io";

/** Runs a command in-process with captured output. */
export async function runCli(run: (args: string[], io: ReturnType<typeof captureIo>) => Promise<number>, args: string[]) {
  const io = captureIo();
  const code = await run(args, io);
  return { code, stdout: io.stdout(), stderr: io.stderr() };
}

/** A temporary directory for files a test writes; `cleanup` removes it. */
export function tempDir() {
  const dir = mkdtempSync(join(tmpdir(), "squarely-cli-"));
  return {
    file(name: string, content: string) {
      const path = join(dir, name);
      writeFileSync(path, content);
      return path;
    },
    cleanup: () => rmSync(dir, { recursive: true, force: true }),
  };
}

export const FIXTURES = join(process.cwd(), "tests/fixtures/core");
