"use client";

import { useRouter } from "next/navigation";
import { useId, useMemo, useState } from "react";
import { buttonClass } from "@/components/ui/button";
import { DEFAULT_FIELDS, FORM_KINDS, jobParams, type FormKind, type JobFields } from "@/components/workbench/jobForms";
import { MAP_FORM_KINDS, verifyChainParams, verifyMapParams, type MapFormKind } from "@/components/workbench/mapJobForms";
import { EMPTY_MAP_JOB, MapJobFields, type MapJobState } from "./map-job-fields";

export type KindOption = { name: string; title: string; example: unknown };

const isFormKind = (name: string): name is FormKind => (FORM_KINDS as readonly string[]).includes(name);
const isMapFormKind = (name: string): name is MapFormKind => (MAP_FORM_KINDS as readonly string[]).includes(name);
/** Whether a kind has a form (every product kind now); a kind without one is started from its JSON. */
const hasForm = (name: string) => isFormKind(name) || isMapFormKind(name);

/** The params a form gives, or its errors by field; null for a kind without a form. */
function formParams(kind: string, fields: JobFields, mapJob: MapJobState) {
  if (isFormKind(kind)) return jobParams(kind, fields);
  if (kind === "verify-map") return verifyMapParams(mapJob.picks[0] ?? null);
  if (kind === "verify-chain") return verifyChainParams({ name: mapJob.name, save: mapJob.save }, mapJob.picks);
  return null;
}
const inputClass = "mt-1 w-full rounded-md border border-line-strong bg-paper-raised px-2 py-1.5 text-sm";

/**
 * Starts a job through POST /api/jobs and opens its page. Each kind has a form; the JSON of the
 * parameters stays available behind "Advanced". Errors appear next to their field.
 */
export function NewJobForm({ kinds }: { kinds: KindOption[] }) {
  const router = useRouter();
  const id = useId();
  const [kind, setKind] = useState(kinds[0]?.name ?? "");
  const [fields, setFields] = useState<JobFields>(() => (isFormKind(kinds[0]?.name ?? "") ? { ...DEFAULT_FIELDS[kinds[0].name as FormKind] } : {}));
  const [advanced, setAdvanced] = useState(() => !hasForm(kinds[0]?.name ?? ""));
  const [mapJob, setMapJob] = useState<MapJobState>(EMPTY_MAP_JOB);
  const [json, setJson] = useState(() => JSON.stringify(kinds[0]?.example ?? {}, null, 2));
  const [serverError, setServerError] = useState<{ field: string; message: string } | null>(null);
  const [touched, setTouched] = useState(false);
  const [busy, setBusy] = useState(false);

  const fromForm = useMemo(() => formParams(kind, fields, mapJob), [kind, fields, mapJob]);

  function chooseKind(name: string) {
    setKind(name);
    setServerError(null);
    setTouched(false);
    setMapJob(EMPTY_MAP_JOB);
    if (isFormKind(name)) setFields({ ...DEFAULT_FIELDS[name] });
    setAdvanced(!hasForm(name));
    setJson(JSON.stringify(kinds.find((k) => k.name === name)?.example ?? {}, null, 2));
  }

  function toggleAdvanced(on: boolean) {
    if (on && fromForm?.params) setJson(JSON.stringify(fromForm.params, null, 2));
    setAdvanced(on);
  }

  const set = (name: string) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement>) => {
    setFields({ ...fields, [name]: e.target.value });
    setServerError(null);
  };

  async function submit(event: React.FormEvent) {
    event.preventDefault();
    setTouched(true);
    setServerError(null);
    let params: unknown;
    if (advanced) {
      try {
        params = JSON.parse(json);
      } catch {
        setServerError({ field: "params", message: "The parameters are not valid JSON." });
        return;
      }
    } else {
      if (!fromForm?.params) return;
      params = fromForm.params;
    }
    setBusy(true);
    try {
      const response = await fetch("/api/jobs", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ kind, params }) });
      const body = await response.json();
      if (!response.ok) {
        const field = String(body?.error?.field ?? "form");
        setServerError({ field: field.startsWith("params.") && !advanced ? field.slice("params.".length) : field.startsWith("params") ? "params" : field === "kind" ? "kind" : "form", message: body?.error?.message ?? "The job was not started." });
        return;
      }
      router.push(`/jobs/${body.id}`);
    } finally {
      setBusy(false);
    }
  }

  // A field's error shows once the person has changed it (or a map was chosen), or tried to start the job.
  const begun = (name: string) => (isMapFormKind(kind) ? mapJob !== EMPTY_MAP_JOB : fields[name] !== DEFAULT_FIELDS[kind as FormKind]?.[name]);
  const errorFor = (name: string): string | undefined => (serverError?.field === name ? serverError.message : touched || begun(name) ? fromForm?.errors[name] : undefined);
  const field = (name: string, label: string, control: React.ReactNode, hint?: string) => (
    <div key={name}>
      <label htmlFor={`${id}-${name}`} className="block text-sm font-medium">
        {label}
      </label>
      {control}
      {hint ? <p className="mt-0.5 text-xs text-ink-faint">{hint}</p> : null}
      <p id={`${id}-${name}-error`} aria-live="polite" className="mt-1 text-xs text-brick-700">
        {errorFor(name) ?? ""}
      </p>
    </div>
  );
  const text = (name: string, label: string, hint?: string) =>
    field(name, label, <input id={`${id}-${name}`} value={fields[name] ?? ""} onChange={set(name)} className={inputClass} aria-describedby={`${id}-${name}-error`} aria-invalid={errorFor(name) ? true : undefined} />, hint);
  const searchSelect = () =>
    field(
      "search",
      "Search for",
      <select id={`${id}-search`} value={fields.search ?? "projections"} onChange={set("search")} className={inputClass}>
        <option value="projections">binary projections</option>
        <option value="partitions">partitions (congruences)</option>
        <option value="both">both</option>
      </select>,
    );

  const formError = serverError && (serverError.field === "form" || (!advanced && !Object.keys(fields).includes(serverError.field) && serverError.field !== "kind")) ? serverError.message : null;
  return (
    <form onSubmit={submit} className="space-y-3" noValidate aria-label="Start a job">
      {field(
        "kind",
        "Kind",
        <select id={`${id}-kind`} value={kind} onChange={(e) => chooseKind(e.target.value)} className={inputClass}>
          {kinds.map((k) => (
            <option key={k.name} value={k.name}>
              {k.title}
            </option>
          ))}
        </select>,
      )}
      {!advanced && kind === "search-projection" ? (
        <>
          {text("rule", "Rule (0–255)")}
          <div className="grid grid-cols-2 gap-2">
            {text("minBlock", "Smallest block size (2–6)")}
            {text("maxBlock", "Largest block size (2–6)")}
          </div>
          {text("steps", "Steps T per coarse step", "Blank for T = N; else 1 to 2N, block sizes up to 4 (a radius-2 coarse rule when T > N).")}
          {searchSelect()}
        </>
      ) : null}
      {!advanced && kind === "eca-atlas" ? (
        <>
          <div className="grid grid-cols-2 gap-2">
            {text("minBlock", "Smallest block size (from 2)")}
            {text("maxBlock", "Largest block size", "At most 5; 9 for partitions alone.")}
          </div>
          {searchSelect()}
        </>
      ) : null}
      {!advanced && kind === "lump-chain" ? (
        <>
          {field(
            "matrix",
            "Transition matrix (one row per line)",
            <textarea id={`${id}-matrix`} rows={4} value={fields.matrix ?? ""} onChange={set("matrix")} spellCheck={false} className={`${inputClass} font-mono text-xs`} aria-describedby={`${id}-matrix-error`} />,
            "Exact entries such as 1/3 or 0.25; each row sums to 1.",
          )}
          {text("labels", "State labels (comma-separated; blank for s0, s1, …)")}
          {text("apart", "States to keep apart (labels, comma-separated)", "The coarsest lumping never merges these with any other state.")}
        </>
      ) : null}
      {!advanced && kind === "totalistic-atlas" ? (
        <>
          <div className="grid grid-cols-2 gap-2">
            {text("minCode", "First code (0–2186)")}
            {text("maxCode", "Last code (0–2186)")}
          </div>
          {field(
            "blocks",
            "Block sizes",
            <select id={`${id}-blocks`} value={fields.blocks ?? "1,2"} onChange={set("blocks")} className={inputClass}>
              <option value="1,2">1 and 2</option>
              <option value="1">1 (merging states)</option>
              <option value="2">2 (partitions of the nine block states)</option>
            </select>,
          )}
        </>
      ) : null}
      {!advanced && kind === "lump-large-chain" ? (
        <>
          <div className="grid grid-cols-2 gap-2">
            {text("groups", "Groups")}
            {text("members", "States per group")}
          </div>
          {text("seed", "Seed", "A generated chain of groups × members states (at most 2,000,000), ten transitions out of each; the job finds its coarsest exact lumping.")}
        </>
      ) : null}
      {!advanced && isMapFormKind(kind) ? <MapJobFields kind={kind} id={id} state={mapJob} onChange={(update) => setMapJob(update)} field={field} /> : null}
      {hasForm(kind) ? (
        <label className="flex items-center gap-2 text-xs text-ink-soft">
          <input type="checkbox" checked={advanced} onChange={(e) => toggleAdvanced(e.target.checked)} />
          Advanced: edit the parameters as JSON
        </label>
      ) : null}
      {advanced
        ? field(
            "params",
            "Parameters (JSON)",
            <textarea id={`${id}-params`} value={json} onChange={(e) => setJson(e.target.value)} rows={6} spellCheck={false} className={`${inputClass} font-mono text-xs`} aria-describedby={`${id}-params-error`} />,
          )
        : null}
      <p aria-live="polite" className="text-sm text-brick-700">
        {formError ?? ""}
      </p>
      <button type="submit" disabled={busy || !kind || (!advanced && !fromForm?.params)} className={buttonClass("primary")}>
        {busy ? "Starting…" : "Start job"}
      </button>
    </form>
  );
}
