/**
 * A nudge from the code that enqueues or cancels to the runner in the same process, so that a new
 * job starts at once rather than at the next poll. Kept on globalThis because Next bundles route
 * handlers and instrumentation separately, each with its own copy of this module.
 */
const key = Symbol.for("squarely.jobs.wake");
type Holder = { [key]?: Set<() => void> };

function listeners(): Set<() => void> {
  const holder = globalThis as Holder;
  holder[key] ??= new Set();
  return holder[key];
}

export function wakeJobRunner(): void {
  for (const listener of listeners()) listener();
}

export function onWakeJobRunner(listener: () => void): () => void {
  listeners().add(listener);
  return () => listeners().delete(listener);
}
