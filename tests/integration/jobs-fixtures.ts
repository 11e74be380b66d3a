import { memberships, users, workspaces } from "@/db/schema";
import type { Database } from "@/db/client";
import type { Role } from "@/lib/policy";

/** A workspace with one member per role, inserted directly (the job tests need owners, not sign-in). */
export async function seedPeople(db: Database) {
  const [ws] = await db.insert(workspaces).values({ slug: "queue-lab", name: "Queue lab" }).returning();
  const people = {} as Record<Role | "otherContributor", { id: string; email: string; role: Role }>;
  const roles: [keyof typeof people, Role][] = [
    ["viewer", "viewer"],
    ["contributor", "contributor"],
    ["otherContributor", "contributor"],
    ["curator", "curator"],
    ["admin", "admin"],
  ];
  for (const [key, role] of roles) {
    const email = `${key.toLowerCase()}@queue-lab.test`;
    const [user] = await db.insert(users).values({ email, name: key }).returning();
    await db.insert(memberships).values({ workspaceId: ws.id, userId: user.id, role });
    people[key] = { id: user.id, email, role };
  }
  return { workspace: ws, people };
}

export async function waitFor<T>(probe: () => Promise<T>, accept: (value: T) => boolean, timeoutMs = 20_000): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (accept(value)) return value;
    if (Date.now() > until) throw new Error(`condition not reached within ${timeoutMs} ms; last value: ${JSON.stringify(value)}`);
    await new Promise((r) => setTimeout(r, 25));
  }
}
