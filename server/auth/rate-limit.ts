import "server-only";
import { countAttempt, refundCount } from "@/db/queries/rate-limits";
import { normalizeEmail } from "@/db/queries/users";

/**
 * Limits on what can be guessed or abused without an account: password sign-ins and sign-in-link
 * requests, each counted by account (the e-mail address asked about, whether or not it has an
 * account, so the answer reveals nothing) and by client address. NIST SP 800-63B §5.2.2 asks for at
 * most 100 consecutive failures per account; these are far tighter, and a window is 15 minutes.
 */
export const RATE_LIMITS = {
  "sign-in": { account: 10, address: 30, windowMs: 15 * 60_000 },
  link: { account: 3, address: 10, windowMs: 15 * 60_000 },
} as const satisfies Record<string, { account: number; address: number; windowMs: number }>;

export type LimitedAction = keyof typeof RATE_LIMITS;

export type RateDecision = { allowed: true } | { allowed: false; retryAfterSeconds: number; limitedBy: "account" | "address" };

/**
 * Counts this attempt by account and by address; refuses once either count passes its limit, with
 * the seconds until that window ends. Counted in the database: every app process shares the limit.
 */
export async function checkRateLimit({
  action,
  email,
  address,
  now = new Date(),
}: {
  action: LimitedAction;
  email: string;
  address: string | null;
  now?: Date;
}): Promise<RateDecision> {
  const limits = RATE_LIMITS[action];
  const keys: ["account" | "address", string, number][] = [["account", `${action}:account:${normalizeEmail(email)}`, limits.account]];
  if (address) keys.push(["address", `${action}:address:${address}`, limits.address]);
  let refusal: RateDecision = { allowed: true };
  for (const [by, key, limit] of keys) {
    const hit = await countAttempt({ key, windowMs: limits.windowMs, now });
    if (hit.count > limit && refusal.allowed) {
      const ends = hit.windowStart.getTime() + limits.windowMs;
      refusal = { allowed: false, limitedBy: by, retryAfterSeconds: Math.max(1, Math.ceil((ends - now.getTime()) / 1000)) };
    }
  }
  return refusal;
}

/**
 * Takes back one counted attempt (a sign-in that succeeded), so that only failures add up: a person
 * who signs in often is never locked out by their own successes.
 */
export async function refundAttempt({ action, email, address }: { action: LimitedAction; email: string; address: string | null }): Promise<void> {
  await refundCount({ key: `${action}:account:${normalizeEmail(email)}` });
  if (address) await refundCount({ key: `${action}:address:${address}` });
}

/**
 * The client's address: the last entry of X-Forwarded-For, which the server itself or the reverse
 * proxy in front of it adds (a client can prepend entries, not append them behind a proxy). Without
 * a proxy, `next start` keeps a header the client sent, so the account limit is the one that holds.
 */
export function clientAddress(headers: Headers): string | null {
  const forwarded = headers.get("x-forwarded-for");
  const last = forwarded?.split(",").pop()?.trim();
  return last || headers.get("x-real-ip") || null;
}

/** "2 minutes", "45 seconds": how long until the next attempt, for a form message. */
export function waitText(seconds: number): string {
  if (seconds < 90) return `${seconds} seconds`;
  return `${Math.ceil(seconds / 60)} minutes`;
}
