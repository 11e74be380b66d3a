import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";
import { setDatabase } from "@/db/queries/connection";
import { getModel } from "@/db/queries/models";
import { listOutboxMessages } from "@/db/queries/outbox";
import { setSessionReader } from "@/app/api/_lib/actor";
import * as watchesRoute from "@/app/api/watches/route";
import { certifyDecimation, certifyLumping, sealCertificate } from "@/lib/certificate";
import { canonicalModel, modelAddress } from "@/lib/models";
import { submitCertificate } from "@/server/atlas/submit";
import { closeVerificationPool } from "@/server/atlas/pool";
import { sendMail } from "@/server/mail/send";
import { createOutboxDelivery } from "@/server/mail/outbox";
import { startTestSmtp } from "./watch-smtp";
import { seedPeople } from "./jobs-fixtures";

// Below Linux's ephemeral range (32768–60999): a port there can be taken by any outgoing connection first.
const port = vi.hoisted(() => {
  const chosen = 20_000 + ((process.pid + 7) % 12_000);
  process.env.SMTP_PORT = String(chosen);
  process.env.MAIL_CATCHER = "on";
  return chosen;
});

// An invented four-state chain, lumpable by {a,b},{c,d}: every row of a block puts the same mass
// on each block (3/4 and 1/4 from a and b; 2/3 and 1/3 from c and d) — the strong-lumpability
// condition of Kemeny & Snell, Finite Markov Chains, §6.3, checked here by hand.
const chain = {
  kind: "markov",
  labels: ["a", "b", "c", "d"],
  matrix: [
    ["1/2", "1/4", "1/8", "1/8"],
    ["1/4", "1/2", "0", "1/4"],
    ["1/3", "1/3", "1/6", "1/6"],
    ["1/6", "1/2", "1/3", "0"],
  ],
};
// Row b changed to put 1/2 (not 3/4) on {a,b}: the same partition no longer lumps it.
const notLumpable = { ...chain, matrix: [chain.matrix[0], ["1/4", "1/4", "1/4", "1/4"], chain.matrix[2], chain.matrix[3]] };

let t: TestDatabase;
let smtp: Awaited<ReturnType<typeof startTestSmtp>>;
let ws: string;
let people: Awaited<ReturnType<typeof seedPeople>>["people"];
let signedIn: { id: string; email: string; name: string } | null = null;

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  ({ workspace: { id: ws }, people } = await seedPeople(t.db));
  setSessionReader(async () => signedIn);
  smtp = await startTestSmtp(port);
});

afterAll(async () => {
  await smtp?.close();
  await closeVerificationPool();
  setSessionReader(null);
  setDatabase(null);
  t.cleanup();
});

function built<T>(result: { ok: true; certificate: T } | { ok: false }): T {
  if (!result.ok) throw new Error("the builder refused a certificate the test expects to hold");
  return result.certificate;
}

// What the app's own pages send with a cookie-authenticated write.
const SAME_SITE_JSON = { origin: "http://test", "content-type": "application/json" };
const watchRequest = (method: "POST" | "DELETE" | "GET", modelId: string) =>
  method === "POST"
    ? new Request("http://test/api/watches", { method, headers: SAME_SITE_JSON, body: JSON.stringify({ modelId }) })
    : new Request(`http://test/api/watches?modelId=${encodeURIComponent(modelId)}`, { method, headers: { origin: "http://test" } });
const noParams = { params: Promise.resolve({}) as Promise<Record<string, never>> };

describe("watchers' mail", () => {
  let chainModelId: string;

  it("lets any member watch a model of the workspace, idempotently, and refuses unknown models", async () => {
    await submitCertificate({ workspaceId: ws, userId: people.contributor.id, certificate: built(certifyLumping({ chain, partition: [0, 0, 1, 1] })) });
    const model = await getModel({ workspaceId: ws, idOrAddress: modelAddress(canonicalModel(chain)) });
    expect(model).not.toBeNull();
    chainModelId = model!.id;

    signedIn = null;
    expect((await watchesRoute.POST(watchRequest("POST", chainModelId), noParams)).status).toBe(401);
    signedIn = { id: people.viewer.id, email: people.viewer.email, name: "viewer" };
    for (let i = 0; i < 2; i++) {
      const res = await watchesRoute.POST(watchRequest("POST", chainModelId), noParams);
      expect(res.status).toBe(200);
      expect(await res.json()).toEqual({ modelId: chainModelId, watching: true, watchers: 1 });
    }
    const unknown = await watchesRoute.POST(watchRequest("POST", "no-such-model"), noParams);
    expect(unknown.status).toBe(404);
    expect((await unknown.json()).error.field).toBe("modelId");
    const bad = await watchesRoute.POST(new Request("http://test/api/watches", { method: "POST", headers: SAME_SITE_JSON, body: "{}" }), noParams);
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.field).toBe("modelId");

    signedIn = { id: people.curator.id, email: people.curator.email, name: "curator" };
    await watchesRoute.POST(watchRequest("POST", chainModelId), noParams);
    const off = await watchesRoute.DELETE(watchRequest("DELETE", chainModelId), noParams);
    expect(await off.json()).toEqual({ modelId: chainModelId, watching: false, watchers: 1 });
  });

  it("queues mail for each watcher when a new certified map touches the model, and delivers it", async () => {
    const result = await submitCertificate({
      workspaceId: ws,
      userId: people.contributor.id,
      certificate: built(certifyDecimation({ chain, steps: 2 })),
    });
    expect(result.status).toBe("created");
    const queued = await listOutboxMessages({ workspaceId: ws, mapId: result.mapId });
    expect(queued.map((m) => [m.toAddress, m.status])).toEqual([[people.viewer.email, "pending"]]);

    const delivery = createOutboxDelivery({ send: sendMail });
    expect(await delivery.deliverDue()).toEqual({ sent: 1, retrying: 0, failed: 0 });
    expect(smtp.received).toHaveLength(1);
    expect(smtp.received[0].to).toEqual([people.viewer.email]);
    expect(smtp.received[0].subject).toMatch(/^Certified: .+ → .+, decimation$/);
    expect(smtp.received[0].text).toContain(result.address);
    expect((await listOutboxMessages({ workspaceId: ws, mapId: result.mapId }))[0].status).toBe("sent");
  });

  it("mails nothing for a submission that fails its check", async () => {
    const before = await listOutboxMessages({ workspaceId: ws });
    const honest = built(certifyLumping({ chain, partition: [0, 0, 1, 1] }));
    const forged = sealCertificate({ ...honest, source: notLumpable });
    const err = await submitCertificate({ workspaceId: ws, userId: people.contributor.id, certificate: forged }).catch((e) => e);
    expect(err.code).toBe("does_not_commute");
    expect(err.status).toBe(422);
    expect(await listOutboxMessages({ workspaceId: ws })).toHaveLength(before.length);
    const delivery = createOutboxDelivery({ send: sendMail });
    expect(await delivery.deliverDue()).toEqual({ sent: 0, retrying: 0, failed: 0 });
    expect(smtp.received).toHaveLength(1);
  });
});
