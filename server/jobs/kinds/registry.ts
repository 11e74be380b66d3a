import type { JobKind } from "./types";

/** Kinds registered at run time (tests register their own); the product's kinds are added in index.ts. */
const registry = new Map<string, JobKind<unknown>>();

export function registerJobKind(kind: JobKind<unknown>): void {
  registry.set(kind.name, kind);
}

export function getJobKind(name: string): JobKind<unknown> | null {
  return registry.get(name) ?? null;
}

export function listJobKinds(): JobKind<unknown>[] {
  return [...registry.values()];
}
