import "server-only";
import { and, eq, gt, isNull, lt } from "drizzle-orm";
import { signInTokens } from "../schema";
import { getDatabase, withDb, type Executor } from "./connection";

/** Stores a one-time sign-in token by its hash; the token itself is only ever in the e-mail. */
export async function createSignInToken(
  { email, tokenHash, expiresAt }: { email: string; tokenHash: string; expiresAt: Date },
  db: Executor = getDatabase(),
): Promise<void> {
  await withDb("saving a sign-in link", async () => {
    await db.delete(signInTokens).where(lt(signInTokens.expiresAt, new Date()));
    await db.insert(signInTokens).values({ email, tokenHash, expiresAt });
  });
}

/**
 * Marks the token used and returns its e-mail address, or null when it is unknown, used or expired.
 * One conditional UPDATE, so two clicks racing on the same link cannot both succeed.
 */
export async function consumeSignInToken(
  { tokenHash, now = new Date() }: { tokenHash: string; now?: Date },
  db: Executor = getDatabase(),
): Promise<string | null> {
  return withDb("using a sign-in link", async () => {
    const rows = await db
      .update(signInTokens)
      .set({ usedAt: now })
      .where(and(eq(signInTokens.tokenHash, tokenHash), isNull(signInTokens.usedAt), gt(signInTokens.expiresAt, now)))
      .returning({ email: signInTokens.email });
    return rows[0]?.email ?? null;
  });
}
