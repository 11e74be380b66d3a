/**
 * A 400 × 400 space-time diagram (rule 110, seeded random row) computed and painted in chromium by the
 * code the model page runs (lib/ca spaceTime + the ImageData painter), against drawing the same
 * diagram with one fillRect per cell in the same page. Target: under 100 ms.
 */
import { build } from "esbuild";
import { fileURLToPath } from "node:url";
import { launchBrowser } from "@/tests/support/browser";

const root = fileURLToPath(new URL("..", import.meta.url));

export async function main(): Promise<void> {
  const bundled = await build({
    entryPoints: [`${root}bench/spacetime-entry.ts`],
    bundle: true,
    write: false,
    format: "iife",
    target: "es2022",
    tsconfig: `${root}tsconfig.json`,
  });
  const browser = await launchBrowser();
  try {
    const page = await browser.newPage();
    await page.setContent("<!doctype html><html><body></body></html>");
    await page.addScriptTag({ content: bundled.outputFiles[0].text });
    const times = await page.evaluate(() => {
      const b = (globalThis as unknown as { squarelyBench: { render: (n: number, s: number) => number; renderPlain: (n: number, s: number) => number } }).squarelyBench;
      b.render(400, 1); // warm-up (JIT)
      b.renderPlain(400, 1);
      const ours = [2, 3, 4, 5, 6].map((s) => b.render(400, s));
      const plain = [2, 3, 4].map((s) => b.renderPlain(400, s));
      return { ours, plain };
    });
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    const ours = median(times.ours);
    const plain = median(times.plain);
    console.log(`400 × 400 space-time diagram, compute + paint in chromium: median ${ours.toFixed(1)} ms of ${times.ours.length} (target < 100 ms: ${ours < 100 ? "met" : "NOT met"})`);
    console.log(`baseline one fillRect per cell, same page: median ${plain.toFixed(1)} ms; ratio ours / baseline = ${(ours / plain).toFixed(3)}`);
  } finally {
    await browser.close();
  }
}
