import { env } from "@/env";
import { AppError } from "@/server/errors";

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * The cross-site request forgery guard of a cookie-authenticated write: the browser must say the
 * request comes from this site (`Origin`, RFC 6454 §7; or `Sec-Fetch-Site: same-origin`, W3C Fetch
 * Metadata), and a body must be declared `application/json`, which no HTML form can send
 * (OWASP CSRF Prevention Cheat Sheet). Bearer-token requests carry no ambient credential and skip it.
 */
export function requireSameOriginWrite(request: Request): void {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return;
  if (!fromThisSite(request)) {
    throw new AppError("forbidden", "A write signed in by cookie must come from this site's own pages (Origin header); scripts send a Bearer token.", {
      field: "origin",
      details: { origin: request.headers.get("origin") },
    });
  }
  const type = request.headers.get("content-type");
  const length = Number(request.headers.get("content-length") ?? "0");
  const hasBody = type !== null || length > 0 || request.headers.has("transfer-encoding");
  if (hasBody && !isJson(type)) {
    throw new AppError("unsupported_media_type", `The request body must be sent as application/json, not ${type ?? "without a Content-Type"}.`, {
      field: "content-type",
      details: { contentType: type },
    });
  }
}

function isJson(type: string | null): boolean {
  return type !== null && type.split(";")[0].trim().toLowerCase() === "application/json";
}

function fromThisSite(request: Request): boolean {
  const origin = request.headers.get("origin") || null;
  if (origin === null) return request.headers.get("sec-fetch-site") === "same-origin";
  if (origin === "null") return false; // an opaque origin: a sandboxed frame or a data: page
  return ownOrigins(request).has(origin.toLowerCase());
}

function ownOrigins(request: Request): Set<string> {
  const own = new Set([new URL(env.APP_URL).origin.toLowerCase()]);
  try {
    own.add(new URL(request.url).origin.toLowerCase());
  } catch {
    // a relative URL (never under Next): only APP_URL counts
  }
  return own;
}
