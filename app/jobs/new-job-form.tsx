"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { buttonClass } from "@/components/ui/button";

export type KindOption = { name: string; title: string; example: unknown };

/** Starts a job through POST /api/jobs and opens its page; errors appear next to their field. */
export function NewJobForm({ kinds }: { kinds: KindOption[] }) {
  const router = useRouter();
  const id = useId();
  const [kind, setKind] = useState(kinds[0]?.name ?? "");
  const [params, setParams] = useState(() => JSON.stringify(kinds[0]?.example ?? {}, null, 2));
  const [error, setError] = useState<{ field: string; message: string } | null>(null);
  const [busy, setBusy] = useState(false);

  function chooseKind(name: string) {
    setKind(name);
    setParams(JSON.stringify(kinds.find((k) => k.name === name)?.example ?? {}, null, 2));
    setError(null);
  }

  async function submit(event: React.FormEvent) {
    event.preventDefault();
    setError(null);
    let parsed: unknown;
    try {
      parsed = JSON.parse(params);
    } catch {
      setError({ field: "params", message: "The parameters are not valid JSON." });
      return;
    }
    setBusy(true);
    try {
      const response = await fetch("/api/jobs", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ kind, params: parsed }),
      });
      const body = await response.json();
      if (!response.ok) {
        const field = String(body?.error?.field ?? "form");
        setError({ field: field.startsWith("params") ? "params" : field === "kind" ? "kind" : "form", message: body?.error?.message ?? "The job was not started." });
        return;
      }
      router.push(`/jobs/${body.id}`);
    } finally {
      setBusy(false);
    }
  }

  const paramsError = error?.field === "params" ? error.message : null;
  const kindError = error?.field === "kind" ? error.message : null;
  const formError = error?.field === "form" ? error.message : null;
  return (
    <form onSubmit={submit} className="space-y-3" noValidate>
      <div>
        <label htmlFor={`${id}-kind`} className="block text-sm font-medium">
          Kind
        </label>
        <select
          id={`${id}-kind`}
          value={kind}
          onChange={(e) => chooseKind(e.target.value)}
          aria-describedby={kindError ? `${id}-kind-error` : undefined}
          className="mt-1 w-full rounded-md border border-line-strong bg-paper-raised px-2 py-1.5 text-sm"
        >
          {kinds.map((k) => (
            <option key={k.name} value={k.name}>
              {k.title}
            </option>
          ))}
        </select>
        <p id={`${id}-kind-error`} aria-live="polite" className="mt-1 text-xs text-brick-700">
          {kindError}
        </p>
      </div>
      <div>
        <label htmlFor={`${id}-params`} className="block text-sm font-medium">
          Parameters (JSON)
        </label>
        <textarea
          id={`${id}-params`}
          value={params}
          onChange={(e) => setParams(e.target.value)}
          rows={6}
          spellCheck={false}
          aria-invalid={paramsError ? true : undefined}
          aria-describedby={`${id}-params-error`}
          className="mt-1 w-full rounded-md border border-line-strong bg-paper-raised px-2 py-1.5 font-mono text-xs"
        />
        <p id={`${id}-params-error`} aria-live="polite" className="mt-1 text-xs text-brick-700">
          {paramsError}
        </p>
      </div>
      <p aria-live="polite" className="text-sm text-brick-700">
        {formError}
      </p>
      <button type="submit" disabled={busy || !kind} className={buttonClass("primary")}>
        {busy ? "Starting…" : "Start job"}
      </button>
    </form>
  );
}
