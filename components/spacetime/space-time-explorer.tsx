"use client";

import { useMemo, useState } from "react";
import { spaceTime, type RuleTable } from "@/lib/ca";
import { readDiagramForm, type DiagramFields, type DiagramForm, type StartKind } from "./diagramRequest";
import { SpaceTimeCanvas } from "./space-time-canvas";

export type RuleView = { k: number; r: number; table: number[] };

const inputClass = "block w-full rounded-md border bg-paper-raised px-2 py-1.5 font-mono text-sm text-ink focus:border-tide-600 focus:outline-none focus:ring-2 focus:ring-tide-100";

function Control({ id, label, error, children }: { id: DiagramFields; label: string; error?: string; children: React.ReactNode }) {
  return (
    <div className="min-w-0 space-y-1">
      <label htmlFor={`st-${id}`} className="block text-xs font-medium text-ink-soft">
        {label}
      </label>
      {children}
      <p id={`st-${id}-error`} aria-live="polite" className="min-h-4 text-xs text-brick-700">
        {error ?? ""}
      </p>
    </div>
  );
}

/**
 * The space-time diagram of a CA with its controls: width, number of steps and the initial row
 * (random from a shown seed, one cell, or typed). Periodic boundary; time runs downward.
 */
export function SpaceTimeExplorer({ rule, name }: { rule: RuleView; name: string }) {
  const [form, setForm] = useState<DiagramForm>({ width: "160", steps: "100", start: "random", seed: "2026", typed: "" });
  const table: RuleTable = useMemo(() => ({ k: rule.k, r: rule.r, table: Uint8Array.from(rule.table) }), [rule]);
  const request = useMemo(() => readDiagramForm(form, rule.k), [form, rule.k]);
  const diagram = useMemo(() => (request.ok ? spaceTime(table, request.initial, request.steps) : null), [request, table]);
  const errors = request.ok ? {} : request.errors;
  const set = (patch: Partial<DiagramForm>) => setForm((f) => ({ ...f, ...patch }));
  const field = (id: DiagramFields) => ({
    id: `st-${id}`,
    "aria-invalid": errors[id] ? true : undefined,
    "aria-describedby": `st-${id}-error`,
    className: `${inputClass} ${errors[id] ? "border-brick-600" : "border-line-strong"}`,
  });

  return (
    <div className="space-y-3">
      <div className="grid grid-cols-2 gap-x-3 sm:grid-cols-[repeat(4,minmax(0,1fr))_auto]">
        <Control id="width" label="Width (cells)" error={errors.width}>
          <input {...field("width")} inputMode="numeric" value={form.start === "typed" ? String(request.ok ? request.initial.length : "") : form.width} disabled={form.start === "typed"} onChange={(e) => set({ width: e.target.value })} />
        </Control>
        <Control id="steps" label="Steps (rows down)" error={errors.steps}>
          <input {...field("steps")} inputMode="numeric" value={form.steps} onChange={(e) => set({ steps: e.target.value })} />
        </Control>
        <div className="min-w-0 space-y-1">
          <label htmlFor="st-start" className="block text-xs font-medium text-ink-soft">
            Initial row
          </label>
          <select id="st-start" value={form.start} onChange={(e) => set({ start: e.target.value as StartKind })} className={`${inputClass} border-line-strong font-sans`}>
            <option value="random">random, from a seed</option>
            <option value="single">one cell in the middle</option>
            <option value="typed">typed</option>
          </select>
        </div>
        {form.start === "typed" ? (
          <Control id="typed" label={`Cells (digits 0–${(rule.k - 1).toString(36)})`} error={errors.typed}>
            <input {...field("typed")} value={form.typed} placeholder="0010110" onChange={(e) => set({ typed: e.target.value })} />
          </Control>
        ) : (
          <Control id="seed" label="Seed" error={errors.seed}>
            <input {...field("seed")} inputMode="numeric" value={form.seed} disabled={form.start !== "random"} onChange={(e) => set({ seed: e.target.value })} />
          </Control>
        )}
        <div className="flex items-start pt-5">
          <button
            type="button"
            disabled={form.start !== "random"}
            onClick={() => set({ seed: String(Math.floor(Math.random() * 0xffffffff)) })}
            className="rounded-md px-3 py-1.5 text-sm font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50 disabled:opacity-40"
          >
            New seed
          </button>
        </div>
      </div>
      {diagram ? (
        <figure>
          <SpaceTimeCanvas diagram={diagram} label={`Space-time diagram of ${name}: ${diagram.width} cells, ${diagram.rows - 1} steps, time running downward`} />
          <figcaption className="mt-1 text-xs text-ink-faint">
            {diagram.width} cells wide, wrapping around at the ends; {diagram.rows - 1} steps, time running down.
            {form.start === "random" ? <> Seed {form.seed}: the same seed gives the same picture.</> : null}
          </figcaption>
        </figure>
      ) : (
        <p className="rounded-md border border-dashed border-line-strong p-6 text-center text-sm text-ink-faint">Fix the fields above to draw the diagram.</p>
      )}
    </div>
  );
}
