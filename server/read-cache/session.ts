import "server-only";
import { LRUCache } from "lru-cache";
import { getToken } from "next-auth/jwt";
import { env } from "@/env";

/** A decoded session is kept at most this long (and never past the token's own expiry). */
const DECODED_MS = 5 * 60_000;

const decoded = new LRUCache<string, { sub: string }>({ max: 10_000 });

/**
 * The user id of the next-auth session cookie (our JWT sessions, auth.config.ts), or null.
 * Decrypting the JWE costs a key derivation and an AES-CBC + HMAC pass per request, as much as the
 * rest of a read together; the same cookie decodes to the same claims, so the result is remembered
 * per cookie header until the token expires. Only decodes that succeeded are remembered. Whether the
 * person still exists and what they may do is checked by the caller, against the database.
 */
export async function sessionUserId(request: Request): Promise<string | null> {
  const cookie = request.headers.get("cookie");
  if (!cookie) return null;
  const secureCookie = isHttps(request);
  const key = `${secureCookie ? "https" : "http"} ${cookie}`;
  const hit = decoded.get(key);
  if (hit) return hit.sub;
  const token = await getToken({ req: request, secret: env.AUTH_SECRET, secureCookie });
  const sub = typeof token?.sub === "string" && token.sub.length > 0 ? token.sub : null;
  if (sub && typeof token?.exp === "number") {
    const ttl = Math.min(DECODED_MS, token.exp * 1000 - Date.now());
    if (ttl > 0) decoded.set(key, { sub }, { ttl });
  }
  return sub;
}

/** The same choice of cookie name as proxy.ts: `__Secure-` cookies behind HTTPS. */
function isHttps(request: Request): boolean {
  const forwarded = request.headers.get("x-forwarded-proto");
  if (forwarded) return forwarded.split(",")[0].trim() === "https";
  try {
    return new URL(request.url).protocol === "https:";
  } catch {
    return false;
  }
}

/** Tests: forget every decoded session. */
export function forgetDecodedSessions(): void {
  decoded.clear();
}
