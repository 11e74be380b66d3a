import { createHash, randomBytes } from "node:crypto";

/** Every personal token starts with this, so a leaked one is easy to recognise in a log or a scan. */
export const TOKEN_PREFIX = "sqt_";

/** 32 random bytes (256 bits) in base64url after the prefix. */
export function generateTokenSecret(): string {
  return `${TOKEN_PREFIX}${randomBytes(32).toString("base64url")}`;
}

/** Only this SHA-256 (hex) is stored; a 256-bit random secret needs no slow hash. */
export function hashTokenSecret(secret: string): string {
  return createHash("sha256").update(secret, "utf8").digest("hex");
}

/** The part shown in lists so a person can tell tokens apart. */
export function tokenDisplayPrefix(secret: string): string {
  return secret.slice(0, TOKEN_PREFIX.length + 6);
}
