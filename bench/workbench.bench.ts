/**
 * The workbench as a person uses it, against `next start` of the production build (run `npx next build`
 * first): a chain of three new links certified through the same API calls the page makes, and the
 * canvas with 200 nodes in Debian's chromium. The work runs in a child process with the react-server
 * condition (the query layer is server-only); this file only starts it and passes its lines through.
 */
import { spawn } from "node:child_process";

export async function main(): Promise<void> {
  await new Promise<void>((resolve, reject) => {
    const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "bench/workbench-run.ts"], { stdio: "inherit", env: process.env });
    child.once("exit", (code) => (code === 0 ? resolve() : reject(new Error(`workbench bench exited with ${code}`))));
  });
}
