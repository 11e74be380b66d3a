import { hashPassword } from "@/server/auth/password";
import type { Role } from "@/lib/policy";
import type { Executor } from "../queries/connection";
import { setMembership } from "../queries/memberships";
import { ensureUser } from "../queries/users";
import { ensureWorkspace, type WorkspaceRef } from "../queries/workspaces";

/** The invented research group of the demo: one person for each role. */
export const DEMO_WORKSPACE = { slug: "kestrel-lab", name: "Kestrel Lab · coarse-graining atlas" } as const;

export type DemoPerson = { name: string; email: string; role: Role; password: string };

export const DEMO_PEOPLE: readonly DemoPerson[] = [
  { name: "Ines Okonkwo-Berg", email: "ines@kestrel-lab.example", role: "admin", password: "kestrel-admin-2026" },
  { name: "Tomasz Arvelo", email: "tomasz@kestrel-lab.example", role: "curator", password: "kestrel-curator-2026" },
  { name: "Priya Halvorsen", email: "priya@kestrel-lab.example", role: "contributor", password: "kestrel-contributor-2026" },
  { name: "Sam Adeyemi-Lund", email: "sam@kestrel-lab.example", role: "viewer", password: "kestrel-viewer-2026" },
];

/**
 * The group's workspace and members. Idempotent: existing people keep their password and name,
 * and running it again changes nothing but re-asserting each demo role.
 */
export async function seedPeople(db?: Executor): Promise<{ workspace: WorkspaceRef; people: (DemoPerson & { id: string })[] }> {
  const workspace = await ensureWorkspace(DEMO_WORKSPACE, db);
  const people = [];
  for (const person of DEMO_PEOPLE) {
    const user = await ensureUser({ email: person.email, name: person.name, passwordHash: await hashPassword(person.password) }, db);
    await setMembership({ workspaceId: workspace.id, userId: user.id, role: person.role }, db);
    people.push({ ...person, id: user.id });
  }
  return { workspace, people };
}
