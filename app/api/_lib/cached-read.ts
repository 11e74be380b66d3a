import "server-only";
import { StampedCache } from "@/server/read-cache";
import type { Actor } from "./actor";

/**
 * The JSON text of atlas reads, per workspace and URL, stamped with the workspace's atlas counter
 * (read_versions `atlas:<id>`, bumped by triggers in every transaction that writes its models, maps
 * or chains). Only reads whose answer depends on nothing but the workspace and the URL use it, after
 * the caller has checked the actor's role; errors are thrown, never cached.
 */
const responses = new StampedCache<string>({ max: 20_000, ttlMs: 10 * 60_000, maxBytes: 64 * 1024 * 1024, sizeOf: (body) => body.length });

const JSON_HEADERS = { "content-type": "application/json" };

export async function cachedJson(request: Request, actor: Actor, compute: () => Promise<unknown>): Promise<Response> {
  if (actor.atlasVersion === undefined) return Response.json(await compute());
  const url = new URL(request.url);
  const key = `${actor.workspace.id} ${url.pathname}${url.search}`;
  const stamp = String(actor.atlasVersion);
  let body = responses.get(key, stamp);
  if (body === undefined) {
    body = JSON.stringify(await compute());
    responses.set(key, stamp, body);
  }
  return new Response(body, { headers: JSON_HEADERS });
}

/** Tests: forget every cached answer (as a fresh process would). */
export function forgetCachedReads(): void {
  responses.clear();
}
