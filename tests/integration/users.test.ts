import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { createUserWithWorkspace, ensureUser, getUserByEmail } from "@/db/queries/users";
import { listWorkspacesForUser } from "@/db/queries/workspaces";
import { memberships, users, workspaces } from "@/db/schema";
import { hashPassword, verifyPassword } from "@/server/auth/password";
import { useQueryLayerDatabase } from "@/tests/support/query-database";

const testDb = useQueryLayerDatabase();

describe("signing up", () => {
  it("creates the user, their own workspace and an admin membership together", async () => {
    const { user, workspace } = await createUserWithWorkspace({
      email: "  Mira.Solberg@Example.org ",
      name: "Mira Solberg",
      passwordHash: await hashPassword("a long enough secret"),
      workspaceName: "Mira's atlas",
    });
    expect(user.email).toBe("mira.solberg@example.org");
    expect(workspace.slug).toMatch(/^mira-solberg-[0-9a-f]{6}$/);
    expect(await listWorkspacesForUser({ userId: user.id })).toEqual([{ ...workspace, role: "admin" }]);
    const stored = await getUserByEmail({ email: "MIRA.SOLBERG@example.org" });
    expect(await verifyPassword("a long enough secret", stored?.passwordHash)).toBe(true);
    expect(await verifyPassword("a wrong secret", stored?.passwordHash)).toBe(false);
  });

  it("refuses a taken e-mail as a conflict on the email field and writes nothing", async () => {
    const before = await testDb().db.select().from(workspaces);
    const attempt = createUserWithWorkspace({
      email: "mira.solberg@example.org",
      name: "Someone Else",
      passwordHash: "x",
      workspaceName: "Other atlas",
    });
    await expect(attempt).rejects.toMatchObject({ code: "conflict", field: "email" });
    expect(await testDb().db.select().from(workspaces)).toHaveLength(before.length);
    expect(await testDb().db.select().from(users).where(eq(users.name, "Someone Else"))).toEqual([]);
  });

  it("answers no user for an unknown address and a fixed-time check for a missing hash", async () => {
    expect(await getUserByEmail({ email: "nobody@example.org" })).toBeNull();
    expect(await verifyPassword("anything", null)).toBe(false);
  });
});

describe("ensureUser", () => {
  it("is idempotent and leaves an existing row unchanged", async () => {
    const first = await ensureUser({ email: "olu@example.org", name: "Olu", passwordHash: null });
    const second = await ensureUser({ email: "OLU@example.org", name: "Renamed", passwordHash: "h" });
    expect(second).toEqual(first);
    expect(await testDb().db.select().from(users).where(eq(users.email, "olu@example.org"))).toHaveLength(1);
    expect(await testDb().db.select().from(memberships).where(eq(memberships.userId, first.id))).toEqual([]);
  });
});
