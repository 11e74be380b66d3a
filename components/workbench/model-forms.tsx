"use client";

import { useId, useMemo, useState } from "react";
import type { ModelInput } from "@/lib/models";
import { buttonClass } from "@/components/ui/button";
import { modelName } from "./derivedModels";
import { caForm, DescriptionField, ecaForm, ecaRuleTable, markovForm, NameField, TABLE_EDITOR_MAX, TABLE_MAX, tableSize, type FieldErrors } from "./modelForms";

export type NewModel = { model: ModelInput; name: string; description: string };
type Tab = "eca" | "ca" | "markov";

export const inputClass = "w-full rounded border border-line-strong bg-paper-raised px-2 py-1 text-sm";
const labelClass = "block text-xs font-medium text-ink-soft";

/** One labelled field with its error beside it (announced as it changes). */
export function Field({ id, label, error, hint, children }: { id: string; label: string; error?: string; hint?: string; children: React.ReactNode }) {
  return (
    <div className="space-y-0.5">
      <label htmlFor={id} className={labelClass}>
        {label}
      </label>
      {children}
      {hint ? <p className="text-[11px] text-ink-faint">{hint}</p> : null}
      <p id={`${id}-error`} className="text-xs text-brick-700" aria-live="polite">
        {error ?? ""}
      </p>
    </div>
  );
}

/** Make a model in place: ECA by rule number, k-state radius-r CA by table, Markov chain typed or uploaded. */
export function AddModelPanel({ onAdd }: { onAdd: (m: NewModel) => void }) {
  const id = useId();
  const [tab, setTab] = useState<Tab>("eca");
  const [rule, setRule] = useState("");
  const [k, setK] = useState("3");
  const [r, setR] = useState("1");
  const [digits, setDigits] = useState("");
  const [matrix, setMatrix] = useState("");
  const [labels, setLabels] = useState("");
  const [name, setName] = useState("");
  const [description, setDescription] = useState("");
  const [touched, setTouched] = useState(false);

  const result = useMemo(() => {
    if (tab === "eca") return ecaForm({ rule });
    if (tab === "ca") return caForm({ k, r, digits });
    return markovForm({ matrix, labels });
  }, [tab, rule, k, r, digits, matrix, labels]);
  const nameCheck = NameField.safeParse(name);
  const descriptionCheck = DescriptionField.safeParse(description);
  const errors: FieldErrors = {
    ...result.errors,
    ...(nameCheck.success ? {} : { name: nameCheck.error.issues[0].message }),
    ...(descriptionCheck.success ? {} : { description: descriptionCheck.error.issues[0].message }),
  };
  const shown = (field: string) => (touched || fieldTouched(field) ? errors[field] : undefined);
  const fieldTouched = (field: string) =>
    (field === "rule" && rule !== "") || (field === "table" && digits !== "") || (field === "matrix" && matrix !== "") || field === "k" || field === "r" || field === "labels" || field === "name" || field === "description";
  const valid = result.model !== null && Object.keys(errors).length === 0;

  function add(event: React.FormEvent) {
    event.preventDefault();
    setTouched(true);
    if (!valid || !result.model) return;
    onAdd({ model: result.model, name: name.trim() || modelName(result.model), description: description.trim() });
    setName("");
    setDescription("");
    setTouched(false);
  }

  async function upload(file: File | undefined) {
    if (!file) return;
    if (file.size > 2_000_000) {
      setMatrix(`# ${file.name} is larger than 2 MB`);
      return;
    }
    setMatrix(await file.text());
  }

  const described = (field: string) => (shown(field) ? `${id}-${field}-error` : undefined);
  const size = (() => {
    const kk = Number(k);
    const rr = Number(r);
    return Number.isInteger(kk) && Number.isInteger(rr) && kk >= 2 && rr >= 1 ? tableSize(kk, rr) : null;
  })();

  return (
    <form onSubmit={add} className="space-y-2" noValidate aria-label="Make a model">
      <div role="tablist" aria-label="Kind of model" className="flex gap-1">
        {(
          [
            ["eca", "ECA"],
            ["ca", "k-state CA"],
            ["markov", "Markov chain"],
          ] as const
        ).map(([value, text]) => (
          <button
            key={value}
            type="button"
            role="tab"
            aria-selected={tab === value}
            onClick={() => {
              setTab(value);
              setTouched(false);
            }}
            className={`rounded px-2 py-1 text-xs font-semibold ${tab === value ? "bg-tide-700 text-paper-raised" : "text-tide-800 ring-1 ring-inset ring-line-strong"}`}
          >
            {text}
          </button>
        ))}
      </div>

      {tab === "eca" ? (
        <>
          <Field id={`${id}-rule`} label="Rule number (0–255, Wolfram code)" error={shown("rule")}>
            <input id={`${id}-rule`} inputMode="numeric" value={rule} onChange={(e) => setRule(e.target.value)} className={inputClass} aria-invalid={shown("rule") ? true : undefined} aria-describedby={described("rule")} />
          </Field>
          {result.model?.kind === "eca" ? <EcaTable rule={result.model.rule} /> : null}
        </>
      ) : null}

      {tab === "ca" ? (
        <>
          <div className="grid grid-cols-2 gap-2">
            <Field id={`${id}-k`} label="Alphabet size k (2–8)" error={shown("k")}>
              <input id={`${id}-k`} inputMode="numeric" value={k} onChange={(e) => setK(e.target.value)} className={inputClass} aria-describedby={described("k")} />
            </Field>
            <Field id={`${id}-r`} label="Radius r (1–3)" error={shown("r")}>
              <input id={`${id}-r`} inputMode="numeric" value={r} onChange={(e) => setR(e.target.value)} className={inputClass} aria-describedby={described("r")} />
            </Field>
          </div>
          {size !== null && size <= TABLE_EDITOR_MAX ? (
            <TableEditor k={Number(k)} r={Number(r)} digits={digits} onChange={setDigits} />
          ) : null}
          <Field
            id={`${id}-table`}
            label={`Rule table digits${size !== null ? ` (${size} entries)` : ""}`}
            error={shown("table")}
            hint={`Entry i is the new centre value for the neighbourhood read as a base-k number, leftmost cell most significant. Cell by cell up to ${TABLE_EDITOR_MAX} entries; paste digits up to ${TABLE_MAX}.`}
          >
            <textarea id={`${id}-table`} rows={2} value={digits} onChange={(e) => setDigits(e.target.value)} spellCheck={false} className={`${inputClass} font-mono text-xs`} aria-describedby={described("table")} />
          </Field>
        </>
      ) : null}

      {tab === "markov" ? (
        <>
          <Field
            id={`${id}-matrix`}
            label="Transition matrix (one row per line)"
            error={shown("matrix")}
            hint="Exact entries: 1/3, or decimals such as 0.25 (converted exactly). Cells separated by commas, tabs or spaces; each row sums to 1."
          >
            <textarea id={`${id}-matrix`} rows={4} value={matrix} onChange={(e) => setMatrix(e.target.value)} spellCheck={false} className={`${inputClass} font-mono text-xs`} aria-describedby={described("matrix")} />
          </Field>
          <Field id={`${id}-file`} label="…or upload a CSV or Matrix Market (.mtx) file">
            <input id={`${id}-file`} type="file" accept=".csv,.txt,.mtx,text/csv,text/plain" onChange={(e) => upload(e.target.files?.[0])} className="text-xs" />
          </Field>
          <Field id={`${id}-labels`} label="State labels (comma-separated; blank for s0, s1, …)" error={shown("labels")}>
            <input id={`${id}-labels`} value={labels} onChange={(e) => setLabels(e.target.value)} className={inputClass} aria-describedby={described("labels")} />
          </Field>
        </>
      ) : null}

      <Field id={`${id}-name`} label="Name (optional)" error={shown("name")}>
        <input id={`${id}-name`} value={name} onChange={(e) => setName(e.target.value)} placeholder={result.model ? modelName(result.model) : ""} className={inputClass} />
      </Field>
      <Field id={`${id}-description`} label="Description (optional)" error={shown("description")}>
        <input id={`${id}-description`} value={description} onChange={(e) => setDescription(e.target.value)} className={inputClass} />
      </Field>
      <button type="submit" className={buttonClass("secondary", "w-full py-1.5")} disabled={!valid}>
        Add to canvas
      </button>
    </form>
  );
}

function EcaTable({ rule }: { rule: number }) {
  const rows = ecaRuleTable(rule);
  return (
    <table className="w-full table-fixed text-center font-mono text-[11px]" aria-label={`Rule table of ECA ${rule}`}>
      <tbody>
        <tr>
          {rows.map((row) => (
            <th key={row.neighbourhood} scope="col" className="font-normal text-ink-faint">
              {row.neighbourhood}
            </th>
          ))}
        </tr>
        <tr>
          {rows.map((row) => (
            <td key={row.neighbourhood} className={`border border-line-strong ${row.value ? "bg-ink text-paper-raised" : "bg-paper-raised"}`}>
              {row.value}
            </td>
          ))}
        </tr>
      </tbody>
    </table>
  );
}

/** A cell-by-cell editor for small tables: one button per neighbourhood cycling its new value. */
function TableEditor({ k, r, digits, onChange }: { k: number; r: number; digits: string; onChange: (d: string) => void }) {
  const size = tableSize(k, r);
  const width = 2 * r + 1;
  const values = Array.from({ length: size }, (_, i) => {
    const d = Number(digits.replace(/[\s,]/g, "")[i]);
    return Number.isInteger(d) && d < k ? d : 0;
  });
  const set = (i: number) => onChange(values.map((v, j) => (j === i ? (v + 1) % k : v)).join(""));
  return (
    <div className="grid grid-cols-4 gap-1 sm:grid-cols-6" role="group" aria-label="Rule table">
      {values.map((v, i) => {
        const hood = i.toString(k).padStart(width, "0");
        return (
          <button key={i} type="button" onClick={() => set(i)} className="rounded border border-line px-1 py-0.5 font-mono text-[11px] hover:bg-tide-50" aria-label={`Neighbourhood ${hood}: new value ${v}`}>
            {hood}→<strong>{v}</strong>
          </button>
        );
      })}
    </div>
  );
}
