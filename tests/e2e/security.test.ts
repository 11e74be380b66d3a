import { and, eq, isNull } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApiToken } from "@/db/queries/tokens";
import { apiTokens } from "@/db/schema";
import { generateTokenSecret, hashTokenSecret } from "@/server/tokens";
import { launchBrowser, signedInPage, startTestServer, type TestServer } from "@/tests/support";

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

async function signedIn(role: string): Promise<Page> {
  const page = await signedInPage(browser, server.url, person(role));
  await page.waitForURL(`${server.url}/dashboard`);
  return page;
}

async function tokenOf(role: string, name: string): Promise<{ id: string; secret: string }> {
  const secret = generateTokenSecret();
  const token = await createApiToken({
    userId: person(role).id,
    workspaceId: server.workspace.id,
    name,
    role: "contributor",
    tokenHash: hashTokenSecret(secret),
    prefix: secret.slice(0, 10),
  });
  return { id: token.id, secret };
}

describe("a malformed percent-escape in a path (probe item 9)", () => {
  it("is a 400 on API routes and pages, never a 500", async () => {
    for (const path of ["/api/maps/%ff", "/api/models/%E0%A4%A/maps", "/api/certificates/%c3%28", "/atlas/maps/%ff", "/atlas/models/%ff", "/%ff"]) {
      const res = await fetch(`${server.url}${path}`, { redirect: "manual" });
      expect(res.status, path).toBe(400);
      if (path.startsWith("/api/")) expect(await res.json(), path).toMatchObject({ error: { code: "bad_input", field: "path" } });
      else await res.arrayBuffer();
    }
    // A well-formed escape still reaches its route.
    const fine = await fetch(`${server.url}/api/maps/%41`);
    expect(fine.status).toBe(401);
    await fine.arrayBuffer();
  });
});

describe("revoking a token that is not yours from the settings page (probe item 10)", () => {
  it("answers with a clear message and revokes nothing", async () => {
    const mine = await tokenOf("admin", "admin's notebook");
    const theirs = await tokenOf("curator", "curator's notebook");
    const page = await signedIn("admin");
    await page.goto(`${server.url}/settings/tokens`);
    // The token id travels back as the form's bound argument, which anyone can rewrite.
    const form = page.locator("form:has(button[aria-label='Revoke token admin\\'s notebook'])");
    const fields = await form.locator("input[type=hidden]").evaluateAll((inputs) =>
      inputs.map((i) => [(i as HTMLInputElement).name, (i as HTMLInputElement).value] as [string, string]),
    );
    const bound = fields.find(([, value]) => value === JSON.stringify([mine.id]));
    expect(bound, JSON.stringify(fields)).toBeDefined();
    for (const forged of [theirs.id, "no-such-token", "x".repeat(500)]) {
      const multipart = Object.fromEntries(fields.map(([name, value]) => [name, name === bound![0] ? JSON.stringify([forged]) : value]));
      const res = await page.request.post(`${server.url}/settings/tokens`, { multipart, headers: { origin: server.url }, maxRedirects: 0 });
      expect(res.status(), forged).toBe(303);
      expect(res.headers().location, forged).toContain("/settings/tokens?revoke=unknown");
    }
    const unrevoked = await server.db.select().from(apiTokens).where(isNull(apiTokens.revokedAt));
    expect(unrevoked.map((t) => t.id)).toEqual(expect.arrayContaining([mine.id, theirs.id]));
    await page.goto(`${server.url}/settings/tokens?revoke=unknown`);
    await expect(page.locator("#revoke-message").textContent()).resolves.toContain("nothing was revoked");

    // The real button still revokes the person's own token.
    await page.click("button[aria-label=\"Revoke token admin's notebook\"]");
    await page.waitForURL(/revoke=revoked/);
    const [row] = await server.db.select().from(apiTokens).where(and(eq(apiTokens.id, mine.id)));
    expect(row.revokedAt).not.toBeNull();
    await page.context().close();
  });
});

describe("security headers (probe item 11)", () => {
  it("every answer carries CSP, X-Frame-Options and X-Content-Type-Options, and no X-Powered-By", async () => {
    for (const path of ["/", "/sign-in", "/api/openapi.json", "/api/models"]) {
      const res = await fetch(`${server.url}${path}`, { redirect: "manual" });
      await res.arrayBuffer();
      expect(res.headers.get("content-security-policy"), path).toContain("frame-ancestors 'none'");
      expect(res.headers.get("x-frame-options"), path).toBe("DENY");
      expect(res.headers.get("x-content-type-options"), path).toBe("nosniff");
      expect(res.headers.get("x-powered-by"), path).toBeNull();
    }
  });

  it("the main pages load in chromium without a single Content-Security-Policy violation", async () => {
    const token = await tokenOf("admin", "csp check");
    const made = await fetch(`${server.url}/api/certificates`, {
      method: "POST",
      headers: { authorization: `Bearer ${token.secret}`, "content-type": "application/json" },
      // Land of Oz chain: Grinstead & Snell, Introduction to Probability, Example 11.1.
      body: JSON.stringify({
        build: {
          kind: "lumping",
          partition: [0, 1, 0],
          chain: { kind: "markov", labels: ["R", "N", "S"], matrix: [["1/2", "1/4", "1/4"], ["1/2", "0", "1/2"], ["1/4", "1/4", "1/2"]] },
        },
      }),
    });
    expect(made.status).toBe(201);
    const { mapId } = (await made.json()) as { mapId: string };
    const map = (await (await fetch(`${server.url}/api/maps/${mapId}`, { headers: { authorization: `Bearer ${token.secret}` } })).json()) as {
      source: { id: string };
    };

    const page = await signedIn("admin");
    const violations: string[] = [];
    page.on("console", (m) => {
      if (/Content Security Policy|Refused to/i.test(m.text())) violations.push(`${page.url()}: ${m.text()}`);
    });
    const pages = ["/", "/dashboard", "/atlas", "/atlas/hierarchy", "/atlas/ask", `/atlas/maps/${mapId}`, `/atlas/models/${map.source.id}`, "/chains/workbench", "/jobs", "/settings/tokens", "/api-docs", "/sign-in"];
    for (const path of pages) {
      const res = await page.goto(`${server.url}${path}`);
      expect(res?.status(), path).toBeLessThan(400);
      await page.waitForLoadState("networkidle");
    }
    expect(violations).toEqual([]);
    await page.context().close();
  });
});

describe("rate limits on sign-in and sign-in links (probe item 8)", () => {
  /** One password sign-in through the auth endpoint, the way a script or the probe sends it. */
  async function passwordAttempt(email: string, password: string, from: string): Promise<Response> {
    const csrf = await fetch(`${server.url}/api/auth/csrf`);
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const cookie = csrf.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const res = await fetch(`${server.url}/api/auth/callback/password`, {
      method: "POST",
      redirect: "manual",
      headers: { "content-type": "application/x-www-form-urlencoded", cookie, "x-forwarded-for": from },
      body: new URLSearchParams({ email, password, csrfToken, callbackUrl: `${server.url}/dashboard` }),
    });
    await res.arrayBuffer();
    return res;
  }

  it("the 11th wrong password for an account is 429 with Retry-After, exactly as for an address with no account", async () => {
    const statuses: Record<string, number[]> = {};
    for (const [email, from] of [[person("viewer").email, "203.0.113.1"], ["no-account@kestrel-lab.example", "203.0.113.2"]]) {
      statuses[email] = [];
      for (let i = 0; i < 11; i++) {
        const res = await passwordAttempt(email, "wrong-password-guess", from);
        statuses[email].push(res.status);
        if (i === 10) expect(Number(res.headers.get("retry-after"))).toBeGreaterThan(800); // a 15-minute window, begun seconds ago
      }
    }
    const [known, unknown] = Object.values(statuses);
    expect(known.slice(0, 10).every((s) => s !== 429)).toBe(true);
    expect(known[10]).toBe(429);
    expect(unknown).toEqual(known);
    // From yet another address the account is still locked, even with the right password.
    expect((await passwordAttempt(person("viewer").email, person("viewer").password, "203.0.113.3")).status).toBe(429);

    // The sign-in form shares the limit and says how long to wait.
    const page = await (await browser.newContext()).newPage();
    await page.goto(`${server.url}/sign-in`);
    await page.fill("#email", person("viewer").email);
    await page.fill("#password", person("viewer").password);
    await page.click("form button[type=submit]");
    await expect(page.locator("#form-message [role=alert]").textContent()).resolves.toMatch(/Too many sign-in attempts .* Try again in \d+ minutes/);
    await page.context().close();
  });

  it("a fourth sign-in link for one address within 15 minutes is refused with the same words whether or not it has an account", async () => {
    const answers: Record<string, string[]> = {};
    for (const email of [person("curator").email, "nobody-at-all@kestrel-lab.example"]) {
      const page = await (await browser.newContext()).newPage();
      answers[email] = [];
      for (let i = 0; i < 4; i++) {
        await page.goto(`${server.url}/sign-in-by-link`);
        await page.fill("#email", email);
        await page.click("form button[type=submit]");
        const message = page.locator("#form-message p");
        await message.waitFor();
        answers[email].push((await message.textContent())!.replace(email, "<address>"));
      }
      await page.context().close();
    }
    const [known, unknown] = Object.values(answers);
    expect(known[0]).toContain("If an account uses <address>, a sign-in link is on its way.");
    expect(known[3]).toContain("Too many sign-in links");
    expect(unknown).toEqual(known);
    const links = (await server.readMail()).filter((m) => m.to.includes(person("curator").email));
    expect(links).toHaveLength(3);
  });
});
