import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { changeMemberRole } from "@/db/queries/memberships";
import { createApiToken, revokeApiToken } from "@/db/queries/tokens";
import type { Role } from "@/lib/policy";
import { generateTokenSecret, hashTokenSecret } from "@/server/tokens";
import { startTestServer, type TestServer } from "@/tests/support";

/**
 * The read caches of the real server (`next start`) against writes made by this test process on the
 * same database file: a second process, as in a two-process deployment. Every write must show in
 * the server's very next answer, however often it answered the same request before.
 */
let server: TestServer;

beforeAll(async () => {
  server = await startTestServer();
}, 180_000);
afterAll(async () => {
  await server?.stop();
});

async function tokenOf(role: string, tokenRole: Role): Promise<string> {
  const secret = generateTokenSecret();
  await createApiToken({
    userId: server.person(role).id,
    workspaceId: server.workspace.id,
    name: `cache ${role}`,
    role: tokenRole,
    tokenHash: hashTokenSecret(secret),
    prefix: secret.slice(0, 10),
  });
  return secret;
}

async function get(path: string, headers: Record<string, string>): Promise<{ status: number; json: Record<string, unknown> }> {
  const res = await fetch(`${server.url}${path}`, { headers });
  return { status: res.status, json: (await res.json()) as Record<string, unknown> };
}

const OZ = { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] };

describe("the server's read caches and another process's writes", () => {
  it("a model stored by another process is in the server's next list; a token revoked there is refused at the next request", async () => {
    const bearer = { authorization: `Bearer ${await tokenOf("viewer", "viewer")}` };
    const first = await get("/api/models?limit=100", bearer);
    expect(first.status).toBe(200);
    expect((await get("/api/models?limit=100", bearer)).json).toEqual(first.json);
    await server.db.$client.execute({
      sql: "INSERT INTO models (id, workspace_id, address, kind, name, canonical, states) VALUES ('cache-e2e', ?, ?, 'markov', 'Cache probe chain', ?, 2)",
      args: [server.workspace.id, `sha256:${"c".repeat(64)}`, '{"kind":"markov","labels":["a","b"],"matrix":[["1","0"],["0","1"]]}'],
    });
    const after = await get("/api/models?limit=100", bearer);
    expect((after.json.items as unknown[]).length).toBe((first.json.items as unknown[]).length + 1);
    expect((after.json.items as { name: string }[]).some((m) => m.name === "Cache probe chain")).toBe(true);

    const [row] = (await server.db.$client.execute({ sql: "SELECT id FROM api_tokens WHERE name = 'cache viewer'" })).rows as unknown as { id: string }[];
    await revokeApiToken({ userId: server.person("viewer").id, tokenId: row.id });
    const refused = await get("/api/models?limit=100", bearer);
    expect(refused.status).toBe(401);
    expect(refused.json).toMatchObject({ error: { code: "unauthenticated", field: "authorization" } });
  }, 60_000);

  it("a role lowered by another process is honoured at the server's next request", async () => {
    const bearer = { authorization: `Bearer ${await tokenOf("curator", "contributor")}`, "content-type": "application/json" };
    const post = () => fetch(`${server.url}/api/models`, { method: "POST", headers: bearer, body: JSON.stringify({ model: OZ }) });
    const allowed = await post();
    expect([200, 201]).toContain(allowed.status);
    await allowed.arrayBuffer();
    expect((await get("/api/models?limit=5", bearer)).status).toBe(200);
    const changed = await changeMemberRole({ workspaceId: server.workspace.id, userId: server.person("curator").id, role: "viewer", actorId: server.person("admin").id });
    expect(changed).toBe("changed");
    const refused = await post();
    expect(refused.status).toBe(403);
    expect(await refused.json()).toMatchObject({ error: { code: "forbidden" } });
  }, 60_000);
});
