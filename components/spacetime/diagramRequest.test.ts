import { describe, expect, it } from "vitest";
import { readDiagramForm } from "./diagramRequest";

const base = { width: "8", steps: "5", start: "random" as const, seed: "7", typed: "" };

describe("readDiagramForm", () => {
  it("gives a random row of the chosen width from the shown seed, the same each time", () => {
    const a = readDiagramForm(base, 2);
    const b = readDiagramForm(base, 2);
    if (!a.ok || !b.ok) throw new Error("expected a row");
    expect(a.initial).toHaveLength(8);
    expect(Array.from(a.initial)).toEqual(Array.from(b.initial));
    expect(a.steps).toBe(5);
  });

  it("puts one cell in the middle for a single-cell start", () => {
    const r = readDiagramForm({ ...base, start: "single", width: "5" }, 2);
    if (!r.ok) throw new Error("expected a row");
    expect(Array.from(r.initial)).toEqual([0, 0, 1, 0, 0]);
  });

  it("takes a typed row as it is, its width from its length", () => {
    const r = readDiagramForm({ ...base, start: "typed", typed: "0120", width: "nonsense" }, 3);
    if (!r.ok) throw new Error("expected a row");
    expect(Array.from(r.initial)).toEqual([0, 1, 2, 0]);
  });

  it("names each bad field in words", () => {
    const r = readDiagramForm({ ...base, width: "2", steps: "0", seed: "-3" }, 2);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors.width).toMatch(/width is a whole number from 3 to 1000/);
    expect(r.errors.steps).toMatch(/steps is a whole number from 1 to 1000/);
    const typed = readDiagramForm({ ...base, start: "typed", typed: "012" }, 2);
    expect(typed.ok ? null : typed.errors.typed).toMatch(/cell 3 is “2”/);
  });
});
