import { createHash } from "node:crypto";
import { memberships, users, watches, workspaces } from "@/db/schema";
import type { Database } from "@/db/client";
import type { CertifiedEdgeInput, ModelFields } from "@/db/queries/atlas";
import { ROLES, type Role } from "@/lib/policy";

/** A workspace with one member per role, plus an outsider with no membership. */
export async function seedAtlasPeople(db: Database, slug = "atlas-lab") {
  const [workspace] = await db.insert(workspaces).values({ slug, name: "Atlas lab" }).returning();
  const people = {} as Record<Role, { id: string; email: string }>;
  for (const role of ROLES) {
    const email = `${role}@${slug}.test`;
    const [user] = await db.insert(users).values({ email, name: `The ${role}` }).returning();
    await db.insert(memberships).values({ workspaceId: workspace.id, userId: user.id, role });
    people[role] = { id: user.id, email };
  }
  const [outsider] = await db.insert(users).values({ email: `outsider@${slug}.test`, name: "An outsider" }).returning();
  return { workspace, people, outsider };
}

export async function watchModel(db: Database, workspaceId: string, userId: string, modelId: string) {
  await db.insert(watches).values({ workspaceId, userId, modelId });
}

/** Storage-level stand-ins for verified rows: the query layer stores what the server verified. */
export function ecaFields(rule: number): ModelFields {
  const canonical = JSON.stringify({ kind: "eca", rule });
  return { address: `sha256:${sha(canonical)}`, kind: "eca", name: `ECA ${rule}`, canonical, rule, alphabet: 2, radius: 1 };
}

export function edgeInput(workspaceId: string, userId: string, from: number, to: number, block = 2): CertifiedEdgeInput {
  const body = JSON.stringify({ from, to, block });
  return {
    workspaceId,
    userId,
    certificate: {
      address: `sha256:${sha(body)}`,
      kind: "projection",
      formatVersion: 1,
      body,
      checkerVersion: "test",
      verifiedAt: new Date(),
    },
    source: ecaFields(from),
    target: ecaFields(to),
    map: { kind: "coarse-graining", block, steps: block, summary: `ECA ${from} → ECA ${to} at block ${block}` },
  };
}

function sha(text: string): string {
  return createHash("sha256").update(text).digest("hex");
}
