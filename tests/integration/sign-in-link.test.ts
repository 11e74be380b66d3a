import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { signInTokens } from "@/db/schema";
import { freePort } from "@/tests/support/ports";
import type { TestDatabase } from "@/tests/support/database";
import type { MailCatcher } from "@/server/mail/catcher";

// env.ts reads the environment once at import, so the SMTP port is set before the modules load.
let t: TestDatabase;
let catcher: MailCatcher;
let mailDir: string;
let mod: {
  link: typeof import("@/server/auth/sign-in-link");
  store: typeof import("@/server/mail/store");
};

beforeAll(async () => {
  const port = await freePort();
  mailDir = mkdtempSync(join(tmpdir(), "squarely-link-"));
  process.env.SMTP_PORT = String(port);
  process.env.APP_URL = "http://atlas.test:4000";
  const { startMailCatcher } = await import("@/server/mail/catcher");
  catcher = await startMailCatcher({ port, dir: mailDir });
  t = await (await import("@/tests/support/database")).createTestDatabase();
  const { setDatabase } = await import("@/db/queries/connection");
  setDatabase(t.db);
  const { ensureUser } = await import("@/db/queries/users");
  await ensureUser({ email: "lena@example.org", name: "Lena", passwordHash: null });
  mod = { link: await import("@/server/auth/sign-in-link"), store: await import("@/server/mail/store") };
}, 60_000);
afterAll(async () => {
  (await import("@/db/queries/connection")).setDatabase(null);
  await catcher?.close();
  t?.cleanup();
  rmSync(mailDir, { recursive: true, force: true });
});

describe("e-mail sign-in links", () => {
  it("mails a link to the account's address, stores only the token's hash, and works once", async () => {
    expect(await mod.link.requestSignInLink({ email: "LENA@example.org" })).toEqual({ sent: true });
    const [mail] = await mod.store.listCaughtMessages(mailDir);
    expect(mail.to).toEqual(["lena@example.org"]);
    const url = new URL(mail.text.match(/http\S+/)?.[0] ?? "");
    expect(url.origin + url.pathname).toBe("http://atlas.test:4000/sign-in-by-link");
    const token = url.searchParams.get("token") ?? "";
    expect(token.length).toBeGreaterThanOrEqual(40);

    const stored = await t.db.select().from(signInTokens);
    expect(stored).toHaveLength(1);
    expect(stored[0].tokenHash).toBe(mod.link.hashSignInToken(token));
    expect(JSON.stringify(stored)).not.toContain(token);

    expect(await mod.link.consumeSignInLink(token)).toBe("lena@example.org");
    expect(await mod.link.consumeSignInLink(token)).toBeNull();
  });

  it("sends nothing for an address without an account", async () => {
    const before = (await mod.store.listCaughtMessages(mailDir)).length;
    expect(await mod.link.requestSignInLink({ email: "nobody@example.org" })).toEqual({ sent: false });
    expect(await mod.store.listCaughtMessages(mailDir)).toHaveLength(before);
  });
});
