import { createHmac, timingSafeEqual } from "node:crypto";

/**
 * The signature of a one-click unsubscribe link: HMAC-SHA256 (RFC 2104) over the workspace and the
 * person, keyed with the server's secret. It works signed out and cannot be forged for someone else.
 */
export function unsubscribeToken({ secret, workspaceId, userId }: { secret: string; workspaceId: string; userId: string }): string {
  return createHmac("sha256", secret).update(`unsubscribe\n${workspaceId}\n${userId}`).digest("base64url");
}

export function isUnsubscribeToken({ secret, workspaceId, userId, token }: { secret: string; workspaceId: string; userId: string; token: string }): boolean {
  const expected = Buffer.from(unsubscribeToken({ secret, workspaceId, userId }));
  const given = Buffer.from(token);
  return given.length === expected.length && timingSafeEqual(given, expected);
}

export function unsubscribeUrl({ appUrl, secret, workspaceId, userId }: { appUrl: string; secret: string; workspaceId: string; userId: string }): string {
  const url = new URL("/unsubscribe", appUrl);
  url.searchParams.set("w", workspaceId);
  url.searchParams.set("u", userId);
  url.searchParams.set("s", unsubscribeToken({ secret, workspaceId, userId }));
  return url.toString();
}
