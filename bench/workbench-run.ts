/** The body of bench/workbench.bench.ts (see there); run with --conditions=react-server. */
import type { Page } from "playwright-core";
import { certifyWorkbench, type ApiCall } from "@/components/workbench/certifyWorkbench";
import { layoutWorkbench } from "@/components/workbench/layoutWorkbench";
import { emptyWorkbench, type MapSpec, type WbEdge, type WbNode, type Workbench } from "@/components/workbench/workbenchState";
import { launchBrowser, startTestServer } from "@/tests/support";

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const p95 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * 0.95))];
const ms = (x: number) => `${x.toFixed(1)} ms`;

function node(id: string, rule: number | null): WbNode {
  return { id, name: "", description: "", model: rule === null ? null : { kind: "eca", rule }, modelId: null, note: "", x: 0, y: 0 };
}
function edge(id: string, source: string, target: string, spec: MapSpec): WbEdge {
  return { id, source, target, spec, state: "proposed", mapId: null, certificateAddress: null, problem: null };
}

/** Rule → coarse rule by three projections, each checked by the server as a new map, then the chain. */
function chainOf(name: string, rule: number, projections: number[][]): Workbench {
  const nodes = [node("n0", rule), ...projections.map((_, i) => node(`n${i + 1}`, null))];
  const edges = projections.map((p, i) => edge(`e${i}`, `n${i}`, `n${i + 1}`, { kind: "projection", block: Math.log2(p.length), projection: p }));
  return { nodes, edges, chain: { name, id: null, address: null } };
}

/** A path of n nodes, laid out by dagre as the Re-layout button does. */
function bigCanvas(n: number): Workbench {
  const nodes = Array.from({ length: n }, (_, i) => node(`n${i}`, i === 0 ? 105 : null));
  const edges = nodes.slice(1).map((_, i) => edge(`e${i}`, `n${i}`, `n${i + 1}`, { kind: "projection", block: 2, projection: [0, 1, 1, 0] }));
  const w = { ...emptyWorkbench, nodes, edges };
  const at = layoutWorkbench(w, { width: 190, height: 94 });
  return { ...w, nodes: nodes.map((x) => ({ ...x, ...at[x.id] })) };
}

async function canvasTimes(page: Page, api: ApiCall, url: string, n: number) {
  const created = await api("POST", "/api/drafts", { name: `bench ${n}`, canvas: bigCanvas(n) });
  const id = (created.body as { id: string }).id;
  const t0 = Date.now();
  await page.goto(`${url}/chains/drafts/${id}`);
  await page.locator(".react-flow__node").first().waitFor();
  const firstPaint = Date.now() - t0;
  // Interaction latency: click Re-layout, then wait two animation frames (the frame that shows it).
  const relayout: number[] = [];
  for (let i = 0; i < 5; i++) {
    relayout.push(
      // Passed as text: the page must not see the helpers tsx adds to compiled functions.
      await page.evaluate<number>(`(async () => {
        const button = [...document.querySelectorAll("button")].find((b) => b.textContent === "Re-layout");
        const start = performance.now();
        button.click();
        await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
        return performance.now() - start;
      })()`),
    );
  }
  // Frame times while the canvas is dragged (panned) across.
  const pane = await page.locator(".react-flow__pane").boundingBox();
  await page.evaluate(`(() => {
    window.frames_ = [];
    window.stop_ = false;
    let last = performance.now();
    const tick = (now) => {
      window.frames_.push(now - last);
      last = now;
      if (!window.stop_) requestAnimationFrame(tick);
    };
    requestAnimationFrame(tick);
  })()`);
  const x = pane!.x + pane!.width / 2;
  const y = pane!.y + pane!.height / 2;
  await page.mouse.move(x, y);
  await page.mouse.down();
  for (let i = 0; i < 40; i++) await page.mouse.move(x + Math.sin(i / 4) * 200, y + Math.cos(i / 4) * 120, { steps: 2 });
  await page.mouse.up();
  const frames = await page.evaluate<number[]>(`(() => {
    window.stop_ = true;
    return window.frames_.slice(2);
  })()`);
  return { firstPaint, relayout: median(relayout), frameMedian: median(frames), frameP95: p95(frames) };
}

const server = await startTestServer();
const browser = await launchBrowser();
try {
  const who = server.people.find((p) => p.role === "contributor")!;
  const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
  const page = await context.newPage();
  await page.goto(`${server.url}/sign-in`);
  await page.fill("#email", who.email);
  await page.fill("#password", who.password);
  await page.click("form button[type=submit]");
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
  const cookie = (await context.cookies()).map((c) => `${c.name}=${c.value}`).join("; ");
  let serverTiming = "";
  const api: ApiCall = async (method, path, body) => {
    const res = await fetch(`${server.url}${path}`, {
      method,
      headers: { cookie, origin: server.url, ...(body === undefined ? {} : { "content-type": "application/json" }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    serverTiming = res.headers.get("server-timing") ?? "";
    return { status: res.status, body: await res.json().catch(() => null) };
  };

  // Baseline in the same run: the floor of one authenticated API round trip.
  const floor: number[] = [];
  for (let i = 0; i < 9; i++) {
    const t = performance.now();
    await api("GET", "/api/models?limit=1");
    floor.push(performance.now() - t);
  }
  const base = median(floor);
  console.log(`baseline: one authenticated API request ${ms(base)} (median of 9)`);

  const chains = [
    // Three block-2 links: the composite is a block-8 projection, checked directly over 2^24 windows.
    chainOf("bench: rule 105 in three block-2 links", 105, [[0, 1, 1, 0], [0, 0, 1, 1], [0, 1, 0, 1]]),
    // Rule 146 onto 128 at block 3 (Israeli & Goldenfeld, PRE 73, 026203, 2006), then 128 at block 2 and block 1.
    chainOf("bench: rule 146 at blocks 3, 2, 1", 146, [[0, 0, 0, 0, 0, 0, 0, 1], [0, 0, 0, 1], [0, 1]]),
    // (Three block-3 links would compose to block 27, past the 256-state alphabet a composite may have: refused.)
  ];
  for (const w of chains) {
    const calls: string[] = [];
    const timed: ApiCall = async (method, path, body) => {
      const t0 = performance.now();
      const res = await api(method, path, body);
      calls.push(`${method} ${path.replace(/\/[0-9a-f-]{36}$/, "/:id")} ${(performance.now() - t0).toFixed(0)}${serverTiming ? ` (server: ${serverTiming.replace(/;dur=/g, " ")})` : ""}`);
      return res;
    };
    // The pool lets idle worker threads go, and a cold thread first loads the checker (about a second under
    // load): one small check (fast lane) and one larger one (main lane, 2^18 windows) keep this a measure of a warm server.
    await api("POST", "/api/models", { model: { kind: "eca", rule: 204 } });
    await api("POST", "/api/certificates", { build: { kind: "blocking", rule: 204, block: 6 } });
    const t = performance.now();
    const outcome = await certifyWorkbench(w, timed, () => {});
    const took = performance.now() - t;
    console.log(`  calls (ms): ${calls.join("; ")}`);
    if (!outcome.ok || !outcome.chainId) throw new Error(`${w.chain.name}: ${outcome.message}`);
    const how = (outcome.message.match(/\(([^)]*)\)/) ?? [])[1] ?? "";
    console.log(`${w.chain.name}: 3 new links + chain certified and stored in ${ms(took)} [${how}] (target < 2000 ms: ${took < 2000 ? "met" : "NOT met"}; ${(took / base).toFixed(1)}× baseline request)`);
  }

  const small = await canvasTimes(page, api, server.url, 10);
  const large = await canvasTimes(page, api, server.url, 200);
  console.log(`canvas 10 nodes: first node drawn ${small.firstPaint} ms; re-layout to next frame ${ms(small.relayout)}; pan frame median ${ms(small.frameMedian)}, p95 ${ms(small.frameP95)}`);
  console.log(`canvas 200 nodes: first node drawn ${large.firstPaint} ms; re-layout to next frame ${ms(large.relayout)}; pan frame median ${ms(large.frameMedian)}, p95 ${ms(large.frameP95)}`);
  console.log(`canvas ratio 200/10 nodes: re-layout ${(large.relayout / small.relayout).toFixed(2)}×, pan frame p95 ${(large.frameP95 / small.frameP95).toFixed(2)}×`);
  await context.close();
} finally {
  await browser.close();
  await server.stop();
}
