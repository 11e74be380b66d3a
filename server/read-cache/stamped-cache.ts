import { LRUCache } from "lru-cache";

/**
 * Values remembered with a stamp: the read_versions counters they were read under
 * (db/queries/read-versions.ts). A value is served only while the caller's current stamp is the
 * same, so a write by any process is seen at the next request; the bounds only limit memory.
 */
type Entry<V> = { value: V; stamp: string };

export class StampedCache<V extends string | object> {
  readonly #entries: LRUCache<string, Entry<V>>;

  constructor(options: { max: number; ttlMs: number; maxBytes?: number; sizeOf?: (value: V) => number }) {
    const { max, ttlMs, maxBytes, sizeOf } = options;
    this.#entries = new LRUCache<string, Entry<V>>({
      max,
      ttl: ttlMs,
      ...(maxBytes && sizeOf ? { maxSize: maxBytes, sizeCalculation: (entry: Entry<V>) => Math.max(1, sizeOf(entry.value)) } : {}),
    });
  }

  /** The value and the stamp it was stored under, whatever the current stamp. */
  peek(key: string): Entry<V> | undefined {
    return this.#entries.get(key);
  }

  /** The value when it was stored under `stamp`. */
  get(key: string, stamp: string): V | undefined {
    const hit = this.#entries.get(key);
    return hit && hit.stamp === stamp ? hit.value : undefined;
  }

  set(key: string, stamp: string, value: V): void {
    this.#entries.set(key, { value, stamp });
  }

  clear(): void {
    this.#entries.clear();
  }
}

/** The stamp of a list of counters. */
export function stampOf(versions: readonly number[]): string {
  return versions.join(".");
}
