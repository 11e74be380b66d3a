import { eq } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { countNotes } from "@/db/queries/notes";
import { users } from "@/db/schema";
import { launchBrowser, startTestServer, submitSignIn, type TestServer } from "@/tests/support";

let server: TestServer;
let browser: Browser;

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

const person = (role: string) => server.person(role);

async function newPage(): Promise<Page> {
  const context = await browser.newContext();
  return context.newPage();
}

const signIn = (page: Page, email: string, password: string): Promise<void> => submitSignIn(page, server.url, { email, password });

describe("signing up, in and out", () => {
  it("lets a visitor sign up, see the dashboard of their own atlas, and sign out", async () => {
    const page = await newPage();
    await page.goto(`${server.url}/sign-up`);
    await page.fill("#name", "Noor Vasquez-Lind");
    await page.fill("#email", "Noor@Example.org");
    await page.fill("#password", "rule-146-at-block-3");
    await page.fill("#workspaceName", "Noor's lumping notebook");
    await page.click("form button[type=submit]");
    await page.waitForURL(`${server.url}/dashboard`);
    await expect(page.locator("h1").textContent()).resolves.toBe("Noor's lumping notebook");
    await expect(page.getByText("Signed in as Noor Vasquez-Lind").count()).resolves.toBe(1);
    const [stored] = await server.db.select().from(users).where(eq(users.email, "noor@example.org"));
    expect(stored.passwordHash).toMatch(/^\$2[aby]\$10\$/);

    await page.click("header button:has-text('Sign out')");
    await page.waitForURL(`${server.url}/`);
    await page.goto(`${server.url}/dashboard`);
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await page.context().close();
  });

  it("shows a taken e-mail next to the field and creates nothing", async () => {
    const before = await server.db.select().from(users);
    const page = await newPage();
    await page.goto(`${server.url}/sign-up`);
    await page.fill("#name", "Another Priya");
    await page.fill("#email", person("contributor").email.toUpperCase());
    await page.fill("#password", "long enough password");
    await page.click("form button[type=submit]");
    await page.locator("#email-error p").waitFor();
    await expect(page.locator("#email-error").textContent()).resolves.toContain("already exists");
    await expect(page.locator("#email").getAttribute("aria-describedby")).resolves.toContain("email-error");
    expect(await server.db.select().from(users)).toHaveLength(before.length);
    await page.context().close();
  });

  it("answers a wrong password and an unknown address with the same single message", async () => {
    const page = await newPage();
    const messages: string[] = [];
    for (const [email, password] of [
      [person("viewer").email, "not-the-password"],
      ["nobody@kestrel-lab.example", "not-the-password"],
    ]) {
      await signIn(page, email, password);
      const alert = page.locator("#form-message [role=alert]");
      await alert.waitFor();
      messages.push((await alert.textContent()) ?? "");
    }
    expect(messages).toEqual(["That e-mail and password do not match an account.", "That e-mail and password do not match an account."]);
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await page.context().close();
  });

  it("sends a signed-out visitor of a signed-in page to sign in, and back there afterwards", async () => {
    const page = await newPage();
    await page.goto(`${server.url}/dev/mail`);
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await page.fill("#email", person("admin").email);
    await page.fill("#password", person("admin").password);
    await page.click("form button[type=submit]");
    await page.waitForURL(`${server.url}/dev/mail`);
    await expect(page.locator("h1").textContent()).resolves.toBe("Caught mail");
    await page.context().close();
  });
});

describe("roles are enforced by the server", () => {
  it("lets a contributor add a note, and refuses a viewer the same action with 403 and nothing written", async () => {
    const contributor = await newPage();
    await signIn(contributor, person("contributor").email, person("contributor").password);
    await contributor.waitForURL(`${server.url}/dashboard`);
    let action: { headers: Record<string, string>; body: Buffer } | null = null;
    contributor.on("request", (request) => {
      if (request.method() === "POST" && request.headers()["next-action"])
        action = { headers: request.headers(), body: request.postDataBuffer() ?? Buffer.alloc(0) };
    });
    await contributor.fill("#text", "Contributor note: block 2 supercell of rule 60 is next.");
    await contributor.click("button:has-text('Add note')");
    await contributor.getByText("Contributor note: block 2 supercell of rule 60 is next.").waitFor();
    expect(await countNotes({ workspaceId: server.workspace.id })).toBe(1);
    expect(action).not.toBeNull();

    const viewer = await newPage();
    await signIn(viewer, person("viewer").email, person("viewer").password);
    await viewer.waitForURL(`${server.url}/dashboard`);
    await expect(viewer.locator("#text").count()).resolves.toBe(0);

    // The route handler refuses with 403 and a reason naming the role needed.
    const viaApi = await viewer.request.post(`${server.url}/api/notes`, { headers: { origin: server.url }, data: { text: "viewer tries" } });
    expect(viaApi.status()).toBe(403);
    const body = await viaApi.json();
    expect(body.error.code).toBe("forbidden");
    expect(body.error.message).toContain("contributor");

    // Replaying the contributor's server action with the viewer's session is refused by the action itself.
    const captured = action as unknown as { headers: Record<string, string>; body: Buffer };
    const viewerCookies = (await viewer.context().cookies()).map((c) => `${c.name}=${c.value}`).join("; ");
    const replay = await fetch(`${server.url}/dashboard`, {
      method: "POST",
      headers: { ...captured.headers, origin: server.url, cookie: viewerCookies },
      body: new Uint8Array(captured.body),
      redirect: "manual",
    });
    await replay.arrayBuffer();
    expect(replay.headers.get("x-action-redirect") ?? "").toContain("/forbidden?action=note%3Apost");
    expect(await countNotes({ workspaceId: server.workspace.id })).toBe(1);

    // The page it is sent to says why, with a 403 status.
    const refusal = await viewer.goto(`${server.url}/forbidden?action=note:post`);
    expect(refusal?.status()).toBe(403);
    await expect(viewer.locator("main").textContent()).resolves.toContain("Your role is viewer; to post a note to the team log you need the contributor role or higher.");
    await contributor.context().close();
    await viewer.context().close();
  });

  it("answers bad JSON and a bad field with 400 naming the field", async () => {
    const page = await newPage();
    await signIn(page, person("contributor").email, person("contributor").password);
    await page.waitForURL(`${server.url}/dashboard`);
    const badJson = await page.request.post(`${server.url}/api/notes`, { headers: { "content-type": "application/json", origin: server.url }, data: Buffer.from("{not json") });
    expect(badJson.status()).toBe(400);
    expect((await badJson.json()).error.field).toBe("body");
    const notAnObject = await page.request.post(`${server.url}/api/notes`, { headers: { origin: server.url }, data: ["a", "list"] });
    expect((await notAnObject.json()).error).toMatchObject({ code: "bad_input", field: "body" });
    const emptyText = await page.request.post(`${server.url}/api/notes`, { headers: { origin: server.url }, data: { text: "   " } });
    expect(emptyText.status()).toBe(400);
    expect((await emptyText.json()).error).toMatchObject({ code: "bad_input", field: "text" });
    await page.context().close();
  });
});

describe("the e-mail sign-in link", () => {
  it("arrives in the mail catcher, signs the person in once, and shows up for the operator on /dev/mail", async () => {
    const curator = person("curator");
    const page = await newPage();
    await page.goto(`${server.url}/sign-in-by-link`);
    await page.fill("#email", curator.email);
    await page.click("form button[type=submit]");
    await page.locator("#form-message [role=status]").waitFor();

    const mail = await server.waitForMail((m) => m.to.includes(curator.email));
    expect(mail.subject).toBe("Your Squarely sign-in link");
    const link = mail.text.match(/https?:\/\/\S+sign-in-by-link\?token=\S+/)?.[0];
    expect(link).toBeDefined();
    expect(new URL(link as string).origin).toBe(server.url);

    await page.goto(link as string);
    await page.click("button:has-text('Finish signing in')");
    await page.waitForURL(`${server.url}/dashboard`);
    await expect(page.getByText(`Signed in as ${curator.name}`).count()).resolves.toBe(1);

    const again = await newPage();
    await again.goto(link as string);
    await again.click("button:has-text('Finish signing in')");
    await expect(again.locator("#form-message [role=alert]").textContent()).resolves.toContain("expired or was already used");
    expect(new URL(again.url()).pathname).toBe("/sign-in-by-link");

    const admin = await newPage();
    await signIn(admin, person("admin").email, person("admin").password);
    await admin.waitForURL(`${server.url}/dashboard`);
    await admin.goto(`${server.url}/dev/mail`);
    await expect(admin.locator("article h2").first().textContent()).resolves.toBe("Your Squarely sign-in link");
    for (const p of [page, again, admin]) await p.context().close();
  });

  it("never shows caught mail to someone who signs up (admin of their own workspace) and asks for another person's link", async () => {
    // Regression of the account takeover: a fresh account is admin of its own workspace, yet the
    // catcher's page is for operators (MAIL_OPERATORS) only, so the link stays unseen.
    const victim = person("contributor");
    const attacker = await newPage();
    await attacker.goto(`${server.url}/sign-up`);
    await attacker.fill("#name", "Mallory Test");
    await attacker.fill("#email", "mallory@example.org");
    await attacker.fill("#password", "not-an-operator-2026");
    await attacker.fill("#workspaceName", "Mallory's atlas");
    await attacker.click("form button[type=submit]");
    await attacker.waitForURL(`${server.url}/dashboard`);
    await attacker.goto(`${server.url}/sign-in-by-link`);
    await attacker.fill("#email", victim.email);
    // Signed in, the header's "Sign out" is the page's first form: press the link form's own button.
    await attacker.click("main form button[type=submit]");
    await attacker.locator("#form-message [role=status]").waitFor();
    await server.waitForMail((m) => m.to.includes(victim.email));

    const response = await attacker.goto(`${server.url}/dev/mail`);
    expect(response?.status()).toBe(404);
    await expect(attacker.getByText("sign-in link").count()).resolves.toBe(0);
    await expect(attacker.locator("header a[href='/dev/mail']").count()).resolves.toBe(0);
    await attacker.context().close();
  });

  it("answers the same for an address without an account and sends nothing", async () => {
    const before = (await server.readMail()).length;
    const page = await newPage();
    await page.goto(`${server.url}/sign-in-by-link`);
    await page.fill("#email", "stranger@example.org");
    await page.click("form button[type=submit]");
    await expect(page.locator("#form-message [role=status]").textContent()).resolves.toContain("If an account uses stranger@example.org");
    expect((await server.readMail()).length).toBe(before);
    await page.context().close();
  });
});
