import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import { eq } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createCertifiedEdge, createSearchRecord, upsertModel } from "@/db/queries/atlas";
import { certificates, chains, maps } from "@/db/schema";
import { canonicalModel } from "@/lib/models";
import { symmetryClass } from "@/lib/symmetry";
import { DEFAULT_LIMITS } from "@/lib/verify";
import { modelFields } from "@/server/atlas/model-fields";
import { runVerifyTask, type BuildRequest } from "@/server/atlas/verify-task";
import { launchBrowser, signedInPage, startTestServer, type TestServer } from "@/tests/support";

let server: TestServer;
let browser: Browser;
const mapIds: Record<string, string> = {};

// An invented three-state weather chain; {damp, wet} is a block of a strong lumping because both
// rows put 1/4 on dry and 3/4 on the block (Kemeny & Snell 1960, §6.3).
const WEATHER = { kind: "markov", labels: ["dry", "damp", "wet"], matrix: [["1/2", "1/4", "1/4"], ["1/4", "1/2", "1/4"], ["1/4", "1/4", "1/2"]] };

/** Builds and verifies a certificate with the core's checker, then stores it as the server does. */
async function certify(key: string, build: BuildRequest) {
  const verified = runVerifyTask({ op: "build", build, limits: DEFAULT_LIMITS });
  if (verified.status !== "holds") throw new Error(`${key} does not hold: ${JSON.stringify(verified).slice(0, 300)}`);
  const curator = person("curator");
  const stored = await createCertifiedEdge({
    workspaceId: server.workspace.id,
    userId: curator.id,
    certificate: { ...verified, kind: verified.kind, verifiedAt: new Date() },
    source: verified.source,
    target: verified.target,
    map: { kind: verified.kind, block: verified.block, steps: verified.steps, summary: verified.text },
  });
  mapIds[key] = stored.mapId;
}

const person = (role: string) => server.person(role);

const signedIn = (role: string): Promise<Page> => signedInPage(browser, server.url, person(role));

beforeAll(async () => {
  server = await startTestServer();
  browser = await launchBrowser();
  // Rule 146 onto rule 128 at block 3 with "the block is 111" (Israeli & Goldenfeld, PRE 73, 026203, 2006).
  await certify("146-128", { kind: "projection", rule: 146, block: 3, projection: [0, 0, 0, 0, 0, 0, 0, 1] });
  await certify("128-128", { kind: "projection", rule: 128, block: 2, projection: [0, 0, 0, 1] });
  await certify("90-90", { kind: "projection", rule: 90, block: 2, projection: [0, 1, 1, 0] });
  await certify("weather-lump", { kind: "lumping", chain: WEATHER, partition: [0, 1, 1] });
  const eca0 = await upsertModel({ workspaceId: server.workspace.id, model: modelFields(canonicalModel({ kind: "eca", rule: 0 }), symmetryClass) });
  const eca90 = modelFields(canonicalModel({ kind: "eca", rule: 90 }), symmetryClass);
  const [{ id: eca90Id }] = await server.db.select({ id: maps.sourceModelId }).from(maps).where(eq(maps.id, mapIds["90-90"]));
  await createSearchRecord({
    workspaceId: server.workspace.id,
    modelId: eca90Id,
    kind: "binary-projections",
    maxBlock: 3,
    algorithm: "exhaustive",
    algorithmVersion: "test",
    coverage: { blocks: [2, 3] },
    outcome: { targets: [eca90.address] },
  });
  expect(eca0.model.name).toBe("ECA 0");
});
afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe("the atlas as a theorist sees it", () => {
  it("lists models, keeps filters in the URL, and names a bad filter next to its field", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/atlas`);
    await expect(page.getByRole("link", { name: "ECA 146", exact: true }).count()).resolves.toBe(1);
    await page.fill("#filter-rule", "146");
    await page.click("form[role=search] button[type=submit]");
    await page.waitForURL(/rule=146/);
    const names = await page.locator("table tbody tr td:first-child").allTextContents();
    expect(names).toEqual(["ECA 146"]);
    await page.goto(`${server.url}/atlas?rule=999`);
    await expect(page.locator("#filter-rule-error").textContent()).resolves.toContain("Rule must be a whole number from 0 to 255");
    await page.goto(`${server.url}/atlas?mapKind=lumping`);
    await expect(page.locator("table tbody tr").count()).resolves.toBe(1);
    await page.context().close();
  });

  it("shows a chain's exact matrix and what it lumps onto", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/atlas?q=3%20states`);
    await page.click("table tbody a");
    await page.waitForURL(/\/atlas\/models\//);
    // The transition matrix itself (the page also shows the lumped matrices of its coarsest lumpings).
    const matrix = page.getByRole("table", { name: /Transition matrix P, exact/ });
    await matrix.waitFor();
    const cells = await matrix.locator("tbody td").allTextContents();
    expect(cells).toEqual(["12", "14", "14", "14", "12", "14", "14", "14", "12"]);
    // The maps panel streams in after the page (Suspense): wait for it rather than count at once.
    await page.getByText("Coarse-grains onto (1)").waitFor();
    await expect(page.getByText("Coarse-grains onto (1)").count()).resolves.toBe(1);
    await page.context().close();
  });

  it("shows a map's certificate, whose download is the stored JSON with the address it claims", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/atlas/maps/${mapIds["146-128"]}`);
    // The expected certificate written out (146 → 128 at block 3, "all three ones", Israeli & Goldenfeld 2004),
    // addressed independently of our code: RFC 8785 via the canonicalize package, SHA-256 via node:crypto.
    const expected = {
      format: "squarely-certificate",
      version: 1,
      map: { kind: "projection", block: 3, steps: 3, projection: [0, 0, 0, 0, 0, 0, 0, 1] },
      source: { kind: "eca", rule: 146 },
      target: { kind: "eca", rule: 128 },
    };
    const address = `sha256:${createHash("sha256").update(canonicalize(expected)!).digest("hex")}`;
    const [cert] = await server.db.select().from(certificates).innerJoin(maps, eq(maps.certificateAddress, certificates.address)).where(eq(maps.id, mapIds["146-128"]));
    expect(cert.certificates.address).toBe(address);
    await expect(page.getByText(address, { exact: true }).count()).resolves.toBeGreaterThan(0);
    const tikz = await page.locator(`pre[aria-label="tikz-cd source of the commuting square"]`).textContent();
    expect(tikz).toContain("\\begin{tikzcd}");
    expect(tikz).toContain('"f_{146}^{3}"');
    expect(tikz).toContain('"g_{128}"');
    expect(tikz).toContain('"\\pi \\circ B_{3}"');
    const bibtex = await page.locator(`pre[aria-label="BibTeX entry"]`).textContent();
    expect(bibtex).toContain(`@misc{squarely:${address.slice("sha256:".length, "sha256:".length + 12)},`);
    const href = await page.getByRole("link", { name: "Download certificate (JSON)" }).getAttribute("href");
    const downloaded = decodeURIComponent(href!.slice(href!.indexOf(",") + 1));
    expect(downloaded).toBe(cert.certificates.body);
    const { address: seal, ...content } = JSON.parse(downloaded) as { address: string };
    expect(content).toEqual(expected);
    expect(seal).toBe(address);
    const digest = createHash("sha256").update(canonicalize(content)!).digest("hex");
    expect(`sha256:${digest}`).toBe(address);
    await expect(page.getByRole("button", { name: "Retract this map" }).count()).resolves.toBe(0);
    await page.context().close();
  });

  it("lets a curator retract a map with a reason, refusing an empty one next to the field", async () => {
    const page = await signedIn("curator");
    await page.goto(`${server.url}/atlas/maps/${mapIds["90-90"]}`);
    await page.fill("#retract-reason", "  x ");
    await page.evaluate(() => document.querySelector("#retract-reason")?.removeAttribute("minlength"));
    await page.click("text=Retract this map");
    await page.locator("#retract-reason-error p").waitFor();
    await expect(page.locator("#retract-reason-error").textContent()).resolves.toContain("at least 3 characters");
    const [before] = await server.db.select().from(maps).where(eq(maps.id, mapIds["90-90"]));
    expect(before.status).toBe("certified");

    await page.fill("#retract-reason", "Checked against the wrong projection convention.");
    await page.click("text=Retract this map");
    await page.getByText("The map is retracted").waitFor();
    await expect
      .poll(async () => (await server.db.select().from(maps).where(eq(maps.id, mapIds["90-90"])))[0], { timeout: 10_000 })
      .toMatchObject({ status: "retracted", retractedReason: "Checked against the wrong projection convention." });
    await page.reload();
    await expect(page.getByText("Reason: Checked against the wrong projection convention.").count()).resolves.toBe(1);
    await page.context().close();
  });

  it("draws the ECA hierarchy with one node per symmetry class", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/atlas/hierarchy`);
    await page.locator(".react-flow__node").first().waitFor();
    const nodes = await page.locator(".react-flow__node").allTextContents();
    expect(nodes.some((t) => t.includes("class 146") && t.includes("ECA 146"))).toBe(true);
    await expect(page.locator(".react-flow__edge").count()).resolves.toBeGreaterThanOrEqual(1);
    await page.context().close();
  });

  it("answers yes with the chain, no within a recorded search's bounds, and unknown, saying which", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/atlas/ask?from=ECA%20146&to=128`);
    await expect(page.locator("[data-answer]").getAttribute("data-answer")).resolves.toBe("yes");
    await expect(page.getByText("A chain of 1 certified map leads from ECA 146 to ECA 128").count()).resolves.toBe(1);

    await page.goto(`${server.url}/atlas/ask?from=90&to=0`);
    await expect(page.locator("[data-answer]").getAttribute("data-answer")).resolves.toBe("no");
    await expect(page.getByText("over every block size up to N = 3", { exact: false }).count()).resolves.toBe(1);

    await page.goto(`${server.url}/atlas/ask?from=128&to=146`);
    await expect(page.locator("[data-answer]").getAttribute("data-answer")).resolves.toBe("unknown");
    await expect(page.getByText("no exhaustive search from ECA 128 has been recorded", { exact: false }).count()).resolves.toBe(1);

    await page.goto(`${server.url}/atlas/ask?from=ECA%20999&to=128`);
    await expect(page.locator("#ask-from-error").textContent()).resolves.toContain("No model in this atlas matches");
    await page.context().close();
  });

  it("opens a chain's maps from the old chain address on the workbench, says when they do not form one chain, and stores a sound chain only after the server verified it", async () => {
    const page = await signedIn("contributor");
    // The old chain editor's address (Ask's "Compose and certify this chain" used it) now opens the workbench.
    // Two maps with no model in common (90 → 90 is retracted by the curator's test above, so the lumping is used).
    await page.goto(`${server.url}/chains/new?maps=${mapIds["146-128"]},${mapIds["weather-lump"]}`);
    await page.waitForURL(/\/chains\/workbench\?maps=/);
    await page.getByText("The maps form more than one path.", { exact: false }).waitFor();
    await expect.poll(() => page.locator('[data-edge-label="certified"]').count()).toBe(2);

    const list = page.getByRole("navigation", { name: "Nodes and maps" });
    await list.getByRole("button", { name: /^Markov chain \(3 states\) → / }).click();
    await page.getByRole("button", { name: "Remove this map" }).click();
    await page.getByLabel("Search certified maps").fill("ECA 128");
    await page.getByRole("button", { name: /^Add ECA 128 → ECA 128/ }).first().click();
    await page.getByText("The maps form one chain of 2 links.", { exact: false }).waitFor();
    await page.fill("#chain-name", "Rule 146 to rule 128, then 128 at block 2");
    await page.getByRole("button", { name: "Certify maps and chain" }).click();
    await page.locator("[data-chain-link]").waitFor({ timeout: 60_000 });
    await page.click("[data-chain-link]");
    await page.waitForURL(/\/chains\/[0-9a-f-]{36}$/, { timeout: 60_000 });
    const chainId = page.url().split("/").pop()!;
    const [stored] = await server.db.select().from(chains).where(eq(chains.id, chainId));
    expect(stored.name).toBe("Rule 146 to rule 128, then 128 at block 2");
    await expect(page.locator("[data-verification]").getAttribute("data-verification")).resolves.toBe(stored.verification);
    await expect(page.getByText(stored.compositeCertificateAddress, { exact: true }).count()).resolves.toBe(1);
    await page.context().close();
  });

  it("shows a viewer a chain's maps on the workbench, read-only and without a certify button", async () => {
    const page = await signedIn("viewer");
    await page.goto(`${server.url}/chains/new?maps=${mapIds["146-128"]}`);
    await page.waitForURL(/\/chains\/workbench\?maps=/);
    await page.getByText("Your role may not certify maps or store chains (contributor or higher).").waitFor();
    await page.locator('[data-node-name="ECA 146"]').waitFor();
    await expect(page.getByRole("button", { name: "Certify maps and chain" }).count()).resolves.toBe(0);
    await page.context().close();
  });
});
