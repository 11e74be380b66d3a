import "server-only";
import { env } from "@/env";

/**
 * Whether this person may read the mail catcher's page: only while the catcher is on, and only for
 * an address on the operator list (MAIL_OPERATORS). A workspace role never grants it.
 */
export function isMailOperator(email: string | null | undefined, config: { catcher: "on" | "off"; operators: readonly string[] } = { catcher: env.MAIL_CATCHER, operators: env.MAIL_OPERATORS }): boolean {
  if (config.catcher !== "on" || !email) return false;
  return config.operators.includes(email.trim().toLowerCase());
}
