// The verification worker thread. A plain ES module so that it loads the same way under
// `next start`, vitest and plain node: it enables TypeScript through tsx's scoped loader and runs
// the pure task module (lib/ only: no database, no Next).
import { pathToFileURL } from "node:url";
import { tsImport } from "tsx/esm/api";

let loading = null;

export default async function verifyInWorker({ taskModule, task }) {
  loading ??= tsImport(pathToFileURL(taskModule).href, import.meta.url);
  const mod = await loading;
  return mod.runVerifyTask(task);
}
