import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { consumeSignInToken, createSignInToken } from "@/db/queries/sign-in-tokens";
import { getUserByEmail } from "@/db/queries/users";
import { env } from "@/env";
import { sendMail } from "@/server/mail/send";

/** How long a link stays valid. */
export const SIGN_IN_LINK_MINUTES = 15;

export function hashSignInToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/**
 * Mails a one-time sign-in link when an account has this address. The caller answers the same
 * whether or not it has, so the form does not reveal who has an account.
 */
export async function requestSignInLink({ email }: { email: string }): Promise<{ sent: boolean }> {
  const user = await getUserByEmail({ email });
  if (!user) return { sent: false };
  const token = randomBytes(32).toString("base64url");
  await createSignInToken({
    email: user.email,
    tokenHash: hashSignInToken(token),
    expiresAt: new Date(Date.now() + SIGN_IN_LINK_MINUTES * 60_000),
  });
  const link = new URL("/sign-in-by-link", env.APP_URL);
  link.searchParams.set("token", token);
  await sendMail({
    to: user.email,
    subject: "Your Squarely sign-in link",
    text: [
      `Hello ${user.name},`,
      "",
      `Open this link to sign in to Squarely. It works once, within ${SIGN_IN_LINK_MINUTES} minutes:`,
      "",
      link.toString(),
      "",
      "If you did not ask for it, ignore this message; nobody can sign in without the link.",
    ].join("\n"),
  });
  return { sent: true };
}

/** The e-mail address of a valid, unused link, which is used up by this call; otherwise null. */
export function consumeSignInLink(token: string): Promise<string | null> {
  return consumeSignInToken({ tokenHash: hashSignInToken(token) });
}
