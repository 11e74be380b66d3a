"use client";

import { useActionState } from "react";

export type RetractState = { status: "idle" | "error" | "ok"; message?: string; reasonError?: string };

/** A curator withdraws a map, saying why; the map stays in the atlas, marked retracted. */
export function RetractForm({ action }: { action: (state: RetractState, form: FormData) => Promise<RetractState> }) {
  const [state, formAction, pending] = useActionState(action, { status: "idle" } as RetractState);
  return (
    <form action={formAction} className="space-y-2">
      <label htmlFor="retract-reason" className="block text-sm font-medium text-ink">
        Reason for retracting
      </label>
      <textarea
        id="retract-reason"
        name="reason"
        rows={3}
        required
        minLength={3}
        maxLength={1000}
        placeholder="e.g. stored against the wrong target model"
        aria-invalid={state.reasonError ? true : undefined}
        aria-describedby="retract-reason-error"
        className={`block w-full rounded-md border bg-paper-raised px-3 py-2 text-sm ${state.reasonError ? "border-brick-600" : "border-line-strong"}`}
      />
      <div id="retract-reason-error" aria-live="polite">
        {state.reasonError ? <p className="text-sm text-brick-700">{state.reasonError}</p> : null}
      </div>
      {state.message ? (
        <p role={state.status === "error" ? "alert" : "status"} className={`rounded-md px-3 py-2 text-sm ${state.status === "error" ? "bg-brick-50 text-brick-700" : "bg-moss-50 text-moss-700"}`}>
          {state.message}
        </p>
      ) : null}
      <button
        type="submit"
        disabled={pending}
        className="rounded-md bg-brick-600 px-3 py-1.5 text-sm font-semibold text-paper-raised hover:bg-brick-700 disabled:opacity-60"
      >
        {pending ? "Retracting…" : "Retract this map"}
      </button>
    </form>
  );
}
