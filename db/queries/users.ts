import "server-only";
import { eq } from "drizzle-orm";
import { AppError } from "@/server/errors";
import { memberships, users, workspaces, type User, type Workspace } from "../schema";
import { getDatabase, isUniqueViolation, withDb, wrapDbError, type Executor } from "./connection";

/** E-mail addresses compare case-insensitively; we store them trimmed and lower-cased. */
export function normalizeEmail(email: string): string {
  return email.trim().toLowerCase();
}

export type PublicUser = Pick<User, "id" | "email" | "name">;

export async function getUserByEmail({ email }: { email: string }, db: Executor = getDatabase()): Promise<User | null> {
  return withDb("reading a user", async () => {
    const rows = await db.select().from(users).where(eq(users.email, normalizeEmail(email))).limit(1);
    return rows[0] ?? null;
  });
}

export async function getUserById({ id }: { id: string }, db: Executor = getDatabase()): Promise<User | null> {
  return withDb("reading a user", async () => {
    const rows = await db.select().from(users).where(eq(users.id, id)).limit(1);
    return rows[0] ?? null;
  });
}

function slugify(text: string): string {
  const slug = text
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 32);
  return slug || "atlas";
}

/**
 * Signs a person up: the user, their own workspace and their admin membership in one transaction,
 * so a failure leaves no account without a workspace. A taken e-mail is a conflict on `email`.
 */
export async function createUserWithWorkspace(
  input: { email: string; name: string; passwordHash: string; workspaceName: string },
  db: Executor = getDatabase(),
): Promise<{ user: PublicUser; workspace: Pick<Workspace, "id" | "slug" | "name"> }> {
  const email = normalizeEmail(input.email);
  try {
    return await db.transaction(async (tx) => {
      const [user] = await tx
        .insert(users)
        .values({ email, name: input.name.trim(), passwordHash: input.passwordHash })
        .returning({ id: users.id, email: users.email, name: users.name });
      const slug = `${slugify(input.name)}-${crypto.randomUUID().slice(0, 6)}`;
      const [workspace] = await tx
        .insert(workspaces)
        .values({ slug, name: input.workspaceName.trim() })
        .returning({ id: workspaces.id, slug: workspaces.slug, name: workspaces.name });
      await tx.insert(memberships).values({ workspaceId: workspace.id, userId: user.id, role: "admin" });
      return { user, workspace };
    });
  } catch (err) {
    if (isUniqueViolation(err))
      throw new AppError("conflict", "An account with this e-mail address already exists.", { field: "email", cause: err });
    throw wrapDbError(err, "creating an account");
  }
}

/** Seeds and tests: the user with this e-mail, created when missing; an existing row is left as it is. */
export async function ensureUser(
  input: { email: string; name: string; passwordHash: string | null },
  db: Executor = getDatabase(),
): Promise<PublicUser> {
  return withDb("creating a user", async () => {
    const email = normalizeEmail(input.email);
    await db
      .insert(users)
      .values({ email, name: input.name, passwordHash: input.passwordHash })
      .onConflictDoNothing({ target: users.email });
    const [row] = await db
      .select({ id: users.id, email: users.email, name: users.name })
      .from(users)
      .where(eq(users.email, email));
    return row;
  });
}

export async function markEmailVerified({ id }: { id: string }, db: Executor = getDatabase()): Promise<void> {
  await withDb("updating a user", () => db.update(users).set({ emailVerifiedAt: new Date() }).where(eq(users.id, id)));
}
