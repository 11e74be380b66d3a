// Bundled for chromium by bench/spacetime.bench.ts: the same core and painter the model page runs.
import { ecaTable, randomRow, spaceTime } from "@/lib/ca";
import { paint } from "@/components/spacetime/paint";
import { cellPalette } from "@/components/spacetime/palette";

function canvas(width: number, height: number): CanvasRenderingContext2D {
  const c = document.createElement("canvas");
  c.width = width;
  c.height = height;
  document.body.appendChild(c);
  return c.getContext("2d")!;
}

/** Computes and paints an n × n diagram of rule 110 from a seeded random row, as the page does; ms. */
function render(n: number, seed: number): number {
  const context = canvas(n, n);
  const t = performance.now();
  const d = spaceTime(ecaTable(110), randomRow({ k: 2, width: n, seed }), n - 1);
  paint(context, d, cellPalette(2));
  context.getImageData(0, 0, 1, 1); // forces the pixels to be written before the clock stops
  return performance.now() - t;
}

/** Baseline: the same diagram drawn the plain way, one fillRect per cell. */
function renderPlain(n: number, seed: number): number {
  const context = canvas(n, n);
  const t = performance.now();
  const d = spaceTime(ecaTable(110), randomRow({ k: 2, width: n, seed }), n - 1);
  const palette = cellPalette(2).map((c) => `rgb(${c[0]} ${c[1]} ${c[2]})`);
  for (let i = 0; i < d.cells.length; i++) {
    context.fillStyle = palette[d.cells[i]];
    context.fillRect(i % n, Math.floor(i / n), 1, 1);
  }
  context.getImageData(0, 0, 1, 1);
  return performance.now() - t;
}

(globalThis as unknown as { squarelyBench: unknown }).squarelyBench = { render, renderPlain };
