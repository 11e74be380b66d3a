/* global AbortController, AbortSignal, URL */
// The job worker thread. A plain ES module so that it loads the same way under `next start`,
// vitest, tsx and plain node: it enables TypeScript through tsx's scoped loader and imports the
// static table of compute steps (kinds/computes.ts), which depends on lib/ alone (no database, no Next).
import { tsImport } from "tsx/esm/api";

const PRODUCT_COMPUTES = new URL("./kinds/computes.ts", import.meta.url).href;
const tables = new Map();
const PROGRESS_INTERVAL_MS = 100;

function loadComputes(href) {
  let loading = tables.get(href);
  if (!loading) {
    loading = tsImport(href, import.meta.url).then((mod) => mod.COMPUTES);
    tables.set(href, loading);
  }
  return loading;
}

/**
 * task: { compute, params, cancelFlag: SharedArrayBuffer, port: MessagePort, computes? }: `compute`
 * is a key of the COMPUTES table exported by `computes` (a file URL; the product's table by default).
 * The cancel flag is shared memory rather than a message, because a compute loop that never
 * yields to the event loop would never receive a message; it reads the flag on each progress call.
 */
export default async function runJobTask(task) {
  const flag = new Int32Array(task.cancelFlag);
  const controller = new AbortController();
  // Searches poll `signal.aborted` between nodes; reading the flag there stops them within a node.
  const nativeAborted = Object.getOwnPropertyDescriptor(AbortSignal.prototype, "aborted").get;
  Object.defineProperty(controller.signal, "aborted", {
    configurable: true,
    get() {
      if (!nativeAborted.call(this) && Atomics.load(flag, 0) === 1) controller.abort();
      return nativeAborted.call(this);
    },
  });
  let lastPost = 0;
  let lastFraction = -1;
  const onProgress = (fraction, item) => {
    if (!controller.signal.aborted && Atomics.load(flag, 0) === 1) controller.abort();
    const now = Date.now();
    if (now - lastPost >= PROGRESS_INTERVAL_MS || fraction - lastFraction >= 0.01 || fraction >= 1) {
      lastPost = now;
      lastFraction = fraction;
      task.port.postMessage({ fraction, item: item ?? null });
    }
  };
  try {
    const computes = await loadComputes(task.computes ?? PRODUCT_COMPUTES);
    const compute = computes?.[task.compute];
    if (typeof compute !== "function") throw new Error(`no compute step "${task.compute}" is registered`);
    const output = await compute(task.params, { onProgress, signal: controller.signal });
    return { output, cancelled: controller.signal.aborted || Atomics.load(flag, 0) === 1 };
  } finally {
    task.port.close();
  }
}
