import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedAtlas } from "@/db/seed/atlas";
import { launchBrowser, signedInPage, startTestServer, type TestServer } from "@/tests/support";
import { seedEcaAtlas } from "@/tests/support/eca-atlas";

let server: TestServer;
let browser: Browser;

type Rect = { left: number; top: number; right: number; bottom: number };

/** The page's edge-label and node boxes as the browser lays them out, in screen pixels. */
async function boxes(page: Page): Promise<{ labels: (Rect & { id: string })[]; nodes: Rect[] }> {
  return page.evaluate(() => {
    const rect = (e: Element) => {
      const r = e.getBoundingClientRect();
      return { left: r.left, top: r.top, right: r.right, bottom: r.bottom };
    };
    return {
      labels: [...document.querySelectorAll("[data-edge-label]")].map((e) => ({ id: e.getAttribute("data-edge-label") ?? "", ...rect(e) })),
      nodes: [...document.querySelectorAll(".react-flow__node")].map(rect),
    };
  });
}

/** Pairs of boxes sharing interior area (touching sides do not count), named for a readable failure. */
function intersecting(labels: (Rect & { id: string })[], nodes: Rect[]): string[] {
  const meet = (a: Rect, b: Rect) => a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;
  const found: string[] = [];
  labels.forEach((a, i) => {
    for (const b of labels.slice(i + 1)) if (meet(a, b)) found.push(`${a.id} × ${b.id}`);
    nodes.forEach((n, k) => meet(a, n) && found.push(`${a.id} × node ${k}`));
  });
  return found;
}

async function openHierarchy(width: number, query = ""): Promise<Page> {
  const page = await signedInPage(browser, server.url, server.person("viewer"), { width });
  await page.goto(`${server.url}/atlas/hierarchy${query}`);
  await page.locator(".react-flow__node").first().waitFor();
  return page;
}

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
  const userId = server.person("contributor").id;
  // The demo atlas (its chains, projections and congruences to block 3), then every binary projection
  // of all 256 ECAs to block 4 on top: the largest atlas the hierarchy is asked to draw.
  await seedAtlas({ db: server.db, workspaceId: server.workspace.id, userId, log: () => undefined });
  const full = await seedEcaAtlas({ db: server.db, workspaceId: server.workspace.id, userId });
  expect(full.found).toBeGreaterThan(900);
}, 600_000);
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe("the hierarchy of the full ECA atlas", () => {
  it("draws no edge label over another or over a node at 1366 px, with or without the maps onto the constant rules", async () => {
    for (const query of ["", "?constants=1"]) {
      const page = await openHierarchy(1366, query);
      await page.locator("[data-edge-label]").first().waitFor();
      const { labels, nodes } = await boxes(page);
      expect(nodes.length).toBeGreaterThan(30);
      expect(labels.length).toBeGreaterThanOrEqual(15);
      expect(intersecting(labels, nodes)).toEqual([]);
      await page.context().close();
    }
  });

  it("picks out a class pointed at: its edges' labels, none overlapping, the other edges faded", async () => {
    const page = await openHierarchy(1366, "?constants=1");
    const hub = page.locator(".react-flow__node", { hasText: /^class 204(?!\d)/ });
    await hub.hover();
    await expect.poll(() => hub.locator("[data-emphasis]").getAttribute("data-emphasis")).toBe("picked");
    const status = page.getByText(/^class 204: \d+ class-to-class edges picked out/);
    await status.waitFor();
    const own = Number((await status.textContent())!.match(/: (\d+) /)![1]);
    // Every label drawn now belongs to an edge into or out of class 204 (React Flow redraws its edges a frame after
    // the toolbar, so the labels of the resting drawing are waited out), and most of those edges have theirs.
    const others = (labels: { id: string }[]) => labels.filter((l) => !/(^|->)204$|^204->/.test(l.id));
    await expect.poll(async () => others((await boxes(page)).labels), { timeout: 10_000 }).toEqual([]);
    const { labels, nodes } = await boxes(page);
    expect(own).toBeGreaterThanOrEqual(8);
    expect(labels.length).toBeGreaterThanOrEqual(Math.ceil(own * 0.75));
    expect(intersecting(labels, nodes)).toEqual([]);
    await expect(page.locator('.react-flow__node [data-emphasis="faded"]').count()).resolves.toBeGreaterThan(5);
    await page.context().close();
  });

  it("picks out a class reached with the keyboard", async () => {
    const page = await openHierarchy(1366);
    // React Flow makes its nodes focusable once it has mounted them: wait for that before tabbing.
    const first = page.locator('.react-flow__node[tabindex="0"]').first();
    await first.waitFor();
    await first.focus();
    await page.keyboard.press("Tab");
    const focusedLabel = () => page.evaluate(() => document.activeElement?.closest(".react-flow__node")?.querySelector("span")?.textContent ?? "");
    await expect.poll(focusedLabel, { timeout: 10_000 }).toMatch(/^class \d+$/);
    await page.getByText(new RegExp(`^${await focusedLabel()}: \\d+ class-to-class edges picked out`)).waitFor();
    await page.context().close();
  });

  it("at 390 px opens without unreadable labels and shows them, still apart, once zoomed in", async () => {
    const page = await openHierarchy(390);
    // The opening zoom (0.6) would draw 11 px labels under 7 px high: they wait for a closer look.
    await expect(page.locator("[data-edge-label]").count()).resolves.toBe(0);
    const zoomIn = page.locator(".react-flow__controls-zoomin");
    await zoomIn.click();
    await zoomIn.click();
    await expect.poll(() => page.locator("[data-edge-label]").count(), { timeout: 10_000 }).toBeGreaterThan(0);
    const { labels, nodes } = await boxes(page);
    expect(intersecting(labels, nodes)).toEqual([]);
    await page.context().close();
  });
});
