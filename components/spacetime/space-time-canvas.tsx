"use client";

import { useEffect, useRef } from "react";
import type { SpaceTime } from "@/lib/ca";
import { paint } from "./paint";
import { cellPalette, type Rgb } from "./palette";

/**
 * Draws a space-time diagram on a canvas, one canvas pixel per cell, scaled up by CSS without
 * smoothing: row 0 at the top, time running downward.
 */
export function SpaceTimeCanvas({
  diagram,
  palette,
  cellSize,
  label,
  className = "",
}: {
  diagram: SpaceTime;
  palette?: Rgb[];
  /** CSS pixels per cell; by default the canvas fills its container's width. */
  cellSize?: number;
  label: string;
  className?: string;
}) {
  const ref = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    const canvas = ref.current;
    const context = canvas?.getContext("2d");
    if (!canvas || !context) return;
    paint(context, diagram, palette ?? cellPalette(diagram.k));
  }, [diagram, palette]);
  // Without a cell size the canvas fills its container's width, but never taller than 70% of the screen.
  const style = cellSize
    ? { width: diagram.width * cellSize, height: diagram.rows * cellSize }
    : { aspectRatio: `${diagram.width} / ${diagram.rows}`, maxWidth: `min(100%, calc(70vh * ${diagram.width} / ${diagram.rows}))` };
  return (
    <canvas
      ref={ref}
      width={diagram.width}
      height={diagram.rows}
      role="img"
      aria-label={label}
      style={style}
      className={`block max-w-full border border-line [image-rendering:pixelated] ${cellSize ? "" : "w-full"} ${className}`}
    />
  );
}
