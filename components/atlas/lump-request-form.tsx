"use client";

import { useActionState } from "react";
import type { FormState } from "@/components/ui/form-state";

/**
 * Starts the coarsest-lumping search: the states ticked here stay in different blocks, the others
 * may merge with anything; the search finds the coarsest strong lumping that keeps them apart.
 */
export function LumpRequestForm({ action, labels }: { action: (state: FormState<"apart">, form: FormData) => Promise<FormState<"apart">>; labels: string[] }) {
  const [state, formAction, pending] = useActionState(action, { status: "idle" } as FormState<"apart">);
  const error = state.fieldErrors?.apart?.join(" ");
  return (
    <form action={formAction} className="space-y-3">
      <fieldset aria-describedby="apart-error">
        <legend className="text-sm font-medium">Keep these states apart</legend>
        <div className="mt-2 flex flex-wrap gap-x-4 gap-y-1">
          {labels.map((label, i) => (
            <label key={i} className="flex items-center gap-1.5 text-sm">
              <input type="checkbox" name="apart" value={i} className="accent-tide-700" />
              {label}
            </label>
          ))}
        </div>
      </fieldset>
      <p id="apart-error" aria-live="polite" className="text-sm text-brick-700">
        {error ?? ""}
      </p>
      {state.message ? (
        <p role={state.status === "error" ? "alert" : "status"} className="rounded-md bg-brick-50 px-3 py-2 text-sm text-brick-700">
          {state.message}
        </p>
      ) : null}
      <button type="submit" disabled={pending} className="rounded-md bg-tide-700 px-3 py-1.5 text-sm font-semibold text-paper-raised hover:bg-tide-800 disabled:opacity-60">
        {pending ? "Starting…" : "Find the coarsest lumping"}
      </button>
    </form>
  );
}
