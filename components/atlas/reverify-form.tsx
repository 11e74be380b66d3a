"use client";

import { useActionState } from "react";

type State = { status: "idle" | "ok" | "error"; message?: string };

/** "Re-verify now": runs the checker on the stored certificate again; the page lists each result with its date. */
export function ReverifyForm({ action }: { action: (state: State) => Promise<State> }) {
  const [state, formAction, pending] = useActionState(action, { status: "idle" } as State);
  return (
    <form action={formAction} className="flex flex-wrap items-center gap-3">
      <button type="submit" disabled={pending} className="rounded-md px-3 py-1.5 text-sm font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50 disabled:opacity-60">
        {pending ? "Verifying…" : "Re-verify now"}
      </button>
      <span aria-live="polite" className={`text-sm ${state.status === "error" ? "text-brick-700" : "text-moss-700"}`}>
        {state.message ?? ""}
      </span>
    </form>
  );
}
