// Runs one verification off the command's thread so that `verify --deadline` can stop it: the core is
// synchronous and cannot be interrupted on its own thread. A plain ES module that enables TypeScript
// through tsx's scoped loader, so it loads the same way under tsx, vitest and plain node.
import { parentPort, workerData } from "node:worker_threads";
import { tsImport } from "tsx/esm/api";

const { verifyCertificate } = await tsImport(workerData.module, import.meta.url);
parentPort.postMessage(verifyCertificate(workerData.text, workerData.limits));
