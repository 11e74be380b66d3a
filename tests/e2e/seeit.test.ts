import { readFileSync, writeFileSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createCertifiedEdge } from "@/db/queries/atlas";
import { maps, models, workspaces } from "@/db/schema";
import { symmetryClass } from "@/lib/symmetry";
import { DEFAULT_LIMITS } from "@/lib/verify";
import { runVerifyTask, type BuildRequest } from "@/server/atlas/verify-task";
import { launchBrowser, signedInPage, startTestServer, type TestServer } from "@/tests/support";
import demoAtlas from "@/lib/ca/fixtures/demo-atlas-projections.json";

type DemoMap = { source: { kind: string; rule: number }; target: { kind: string; rule?: number }; block: number; steps: number; projection: number[] };
const ONTO_ZERO = (demoAtlas as DemoMap[]).filter((m) => m.source.kind === "eca" && m.target.kind === "eca" && m.target.rule === 0 && ![0, 128, 146].includes(m.source.rule)).slice(0, 25);

let server: TestServer;
let browser: Browser;

const person = (role: string) => server.person(role);

/** Builds and verifies a certificate with the core's checker, then stores it as the server does. */
async function certify(build: BuildRequest) {
  const verified = runVerifyTask({ op: "build", build, limits: DEFAULT_LIMITS });
  if (verified.status !== "holds") throw new Error(`does not hold: ${JSON.stringify(verified).slice(0, 300)}`);
  return createCertifiedEdge({
    workspaceId: server.workspace.id,
    userId: person("curator").id,
    certificate: { ...verified, kind: verified.kind, verifiedAt: new Date() },
    source: verified.source,
    target: verified.target,
    map: { kind: verified.kind, block: verified.block, steps: verified.steps, summary: verified.text },
  });
}

const signedIn = (role: string): Promise<Page> => signedInPage(browser, server.url, person(role), { width: 1366 });

async function modelId(name: string, workspaceId = server.workspace.id): Promise<string> {
  const [row] = await server.db.select().from(models).where(and(eq(models.workspaceId, workspaceId), eq(models.name, name)));
  return row.id;
}

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
  // Rule 146 onto rule 128 at block 3 with "the block is 111" (Israeli & Goldenfeld, PRE 73, 026203, 2006).
  await certify({ kind: "projection", rule: 146, block: 3, projection: [0, 0, 0, 0, 0, 0, 0, 1] });
  await certify({ kind: "projection", rule: 128, block: 3, projection: [0, 0, 0, 0, 0, 0, 0, 1] });
  // 25 maps onto ECA 0 taken from the demo atlas (lib/ca/fixtures), each certified again here.
  for (const m of ONTO_ZERO) await certify({ kind: "projection", rule: m.source.rule, block: m.block, steps: m.steps, projection: m.projection });
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe("seeing the atlas", () => {
  it("draws ECA 146's space-time diagram, redrawn when the number of steps changes", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/atlas/models/${await modelId("ECA 146")}`);
    const canvas = page.locator('canvas[aria-label^="Space-time diagram of ECA 146"]');
    await canvas.waitFor();
    await expect(canvas.getAttribute("height")).resolves.toBe("101");
    const inked = () =>
      canvas.evaluate((c: HTMLCanvasElement) => {
        const d = c.getContext("2d")!.getImageData(0, 0, c.width, c.height).data;
        let n = 0;
        for (let i = 0; i < d.length; i += 4) if (d[i] === 0x16 && d[i + 1] === 0x54) n++; // tide #16544f, a live cell
        return n;
      });
    expect(await inked()).toBeGreaterThan(100);
    await page.fill("#st-steps", "50");
    await expect.poll(() => canvas.getAttribute("height"), { timeout: 10_000 }).toBe("51");
    await page.context().close();
  });

  it("shows the map onto ECA 128 with the three-panel picture agreeing on every cell, and the square set by KaTeX", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/atlas/models/${await modelId("ECA 146")}`);
    await page.locator("#maps-o").getByRole("link", { name: "certificate →" }).first().click();
    await page.waitForURL(/\/atlas\/maps\//);
    await page.getByText("Equal on all 64 × 40 cells").waitFor();
    await expect(page.locator('canvas[aria-label^="Difference"]').count()).resolves.toBe(1);
    await expect(page.locator('canvas[aria-label^="Coarse"]').getAttribute("width")).resolves.toBe("64");
    await expect(page.locator("figure .katex-display").count()).resolves.toBe(1);
    await page.context().close();
  });

  it("draws the hierarchy in layers, what a class coarse-grains onto below it; maps onto class 0 only when asked", async () => {
    const page = await signedIn("viewer");
    const top = async (label: string) => (await page.locator(".react-flow__node", { hasText: new RegExp(`^${label}(?!\\d)`) }).first().boundingBox())!.y;
    await page.goto(`${server.url}/atlas/hierarchy`);
    await page.locator(".react-flow__node").first().waitFor();
    expect(await top("class 146")).toBeLessThan(await top("class 128"));
    await expect(page.locator(".react-flow__node", { hasText: /^class 0(?!\d)/ }).count()).resolves.toBe(0);
    await page.getByRole("link", { name: "Show them" }).click();
    await page.waitForURL(/constants=1/);
    await page.locator(".react-flow__node", { hasText: /^class 0(?!\d)/ }).waitFor();
    // ONTO_ZERO[0] maps onto ECA 0, so its class lies above class 0.
    expect(await top(`class ${symmetryClass(ONTO_ZERO[0].source.rule)}`)).toBeLessThan(await top("class 0"));
    await page.context().close();
  });

  it("folds the hierarchy's overview behind a button, and the zoom controls cover no node at 1366 px", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/atlas/hierarchy?constants=1`);
    await page.locator(".react-flow__node").first().waitFor();
    await expect(page.locator(".react-flow__minimap").count()).resolves.toBe(0);
    const nodes = await page.locator(".react-flow__node").evaluateAll((els) => els.map((e) => e.getBoundingClientRect().toJSON() as DOMRect));
    const controls = (await page.locator(".react-flow__controls").boundingBox())!;
    const covers = (a: { x: number; y: number; width: number; height: number }, b: DOMRect) =>
      a.x < b.right && b.left < a.x + a.width && a.y < b.bottom && b.top < a.y + a.height;
    expect(nodes.length).toBeGreaterThanOrEqual(3);
    expect(nodes.filter((n) => covers(controls, n))).toEqual([]);
    await page.getByRole("button", { name: "Show an overview" }).click();
    await page.locator(".react-flow__minimap").waitFor();
    await page.getByRole("button", { name: "Hide the overview" }).click();
    await expect.poll(() => page.locator(".react-flow__minimap").count()).toBe(0);
    await page.context().close();
  });

  it("folds the dashboard's maps onto the constant rules into one line that opens", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/dashboard`);
    const recent = page.getByRole("list", { name: "Recently certified" });
    // Only 146 → 128 and 128 → 128 are listed one by one; the 25 maps onto ECA 0 are one closed line.
    await expect(recent.locator(":scope > li > a").allTextContents()).resolves.toEqual(
      expect.arrayContaining(["ECA 146 → ECA 128, projection at block 3", "ECA 128 → ECA 128, projection at block 3"]),
    );
    await expect(recent.locator(":scope > li > a").count()).resolves.toBe(2);
    const folded = recent.locator("details");
    await expect(folded.locator("summary").textContent()).resolves.toContain("25 maps onto the constant rules (ECA 0, ECA 255)");
    await expect(folded.getByRole("list", { name: "Maps onto the constant rules" }).isVisible()).resolves.toBe(false);
    await folded.locator("summary").click();
    const opened = folded.getByRole("list", { name: "Maps onto the constant rules" }).locator("li a");
    await expect(opened.count()).resolves.toBe(5);
    expect((await opened.allTextContents()).every((t) => t.includes("→ ECA 0,"))).toBe(true);
    await page.context().close();
  });

  it("pages through ECA 0's incoming maps twenty at a time", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/atlas/models/${await modelId("ECA 0")}`);
    const list = page.locator("#maps-f");
    expect(ONTO_ZERO).toHaveLength(25);
    await expect(page.getByText("Coarse-grained from (25)").count()).resolves.toBe(1);
    await expect(list.locator("tbody tr").count()).resolves.toBe(20);
    await list.getByRole("link", { name: "Next 20 →" }).click();
    await page.waitForURL(/fcursor=/);
    await expect(page.locator("#maps-f tbody tr").count()).resolves.toBe(5);
    await page.context().close();
  });

  it("exports the workspace and imports it as another person into a new workspace, unchanged", async () => {
    const admin = await signedIn("admin");
    const response = await admin.request.get(`${server.url}/api/workspace/export?format=json`);
    expect(response.status()).toBe(200);
    const text = await response.text();
    const file = join(mkdtempSync(join(tmpdir(), "squarely-bundle-")), "atlas.squarely.json");
    writeFileSync(file, text);
    await admin.context().close();

    const contributor = await signedIn("contributor");
    await contributor.goto(`${server.url}/atlas/exchange`);
    await contributor.setInputFiles("#bundle-file", file);
    await contributor.fill("#bundle-name", "Kestrel copy");
    await contributor.click("text=Import into a new workspace");
    await contributor.locator("#bundle-result [role=status]", { hasText: "Imported" }).waitFor({ timeout: 60_000 });
    const [copy] = await server.db.select().from(workspaces).where(eq(workspaces.name, "Kestrel copy"));
    const addresses = async (workspaceId: string) =>
      (await server.db.select({ a: maps.certificateAddress }).from(maps).where(eq(maps.workspaceId, workspaceId))).map((r) => r.a).sort();
    expect(await addresses(copy.id)).toEqual(await addresses(server.workspace.id));
    expect(JSON.parse(readFileSync(file, "utf8")).certificates.length).toBeGreaterThan(0);
    await contributor.context().close();
  }, 120_000);
});
