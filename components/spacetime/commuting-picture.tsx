"use client";

import { useMemo, useState } from "react";
import { commutingPicture, randomRow, type RuleTable } from "@/lib/ca";
import { DIFFERENCE, EMPTY, cellPalette } from "./palette";
import { SpaceTimeCanvas } from "./space-time-canvas";
import type { RuleView } from "./space-time-explorer";

const WIDTH = 64;
const ROWS = 40;
const tableOf = (r: RuleView): RuleTable => ({ k: r.k, r: r.r, table: Uint8Array.from(r.table) });
const n = (x: number) => x.toLocaleString("en-GB");

/**
 * Three panels that show the square commuting on one random periodic row: the fine CA sampled every
 * T steps and projected block by block, the coarse CA run from the projected first row, and their
 * difference, with the agreement stated in words.
 */
export function CommutingPictureView({
  fine,
  coarse,
  block,
  steps,
  projection,
  fineName,
  coarseName,
}: {
  fine: RuleView;
  coarse: RuleView;
  block: number;
  steps: number;
  projection: number[];
  fineName: string;
  coarseName: string;
}) {
  const [seed, setSeed] = useState(2026);
  const picture = useMemo(() => {
    const f = tableOf(fine);
    return commutingPicture({ fine: f, coarse: tableOf(coarse), block, steps, projection, initial: randomRow({ k: f.k, width: WIDTH * block, seed }), coarseSteps: ROWS - 1 });
  }, [fine, coarse, block, steps, projection, seed]);
  const cells = WIDTH * ROWS;
  const palette = cellPalette(coarse.k);
  const panels = [
    {
      title: "Fine",
      note: `${fineName} on ${n(WIDTH * block)} cells, ${n(picture.fine.rows - 1)} steps`,
      diagram: picture.fine,
      palette: cellPalette(fine.k),
    },
    {
      title: "Fine, projected",
      note: `the fine rows sampled every T = ${steps} steps, each block of ${block} cells replaced by its coarse symbol`,
      diagram: picture.projected,
      palette,
    },
    { title: "Coarse", note: `${coarseName} run from the projected first row`, diagram: picture.coarse, palette },
    { title: "Difference", note: "cells where the two disagree", diagram: picture.difference, palette: [EMPTY, DIFFERENCE] },
  ];
  return (
    <div className="space-y-3">
      <div className="grid grid-cols-2 gap-4 lg:grid-cols-4">
        {panels.map((p) => (
          <figure key={p.title} className="min-w-0">
            <figcaption className="mb-1 text-sm font-medium">{p.title}</figcaption>
            <SpaceTimeCanvas diagram={p.diagram} palette={p.palette} label={`${p.title}: ${p.note}`} />
            <p className="mt-1 text-xs text-ink-faint">{p.note}</p>
          </figure>
        ))}
      </div>
      <div className="flex flex-wrap items-center gap-3">
        {picture.differing === 0 ? (
          <p className="text-sm font-medium text-moss-700" role="status">
            Equal on all {WIDTH} × {ROWS} cells ({n(cells)} of {n(cells)}).
          </p>
        ) : (
          <p className="text-sm font-medium text-brick-700" role="status">
            Different on {n(picture.differing)} of {n(cells)} cells: this projection does not commute.
          </p>
        )}
        <span className="text-xs text-ink-faint">Random start, seed {seed}; rows wrap around at the ends.</span>
        <button
          type="button"
          onClick={() => setSeed(Math.floor(Math.random() * 0xffffffff))}
          className="rounded-md px-3 py-1 text-sm font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50"
        >
          Another random row
        </button>
      </div>
      <p className="text-xs text-ink-faint">
        One row is an illustration; the certificate is the proof: the checker compared both sides on every window of {2 * coarse.r + 1} blocks, hence on every configuration, finite or infinite.
      </p>
    </div>
  );
}
