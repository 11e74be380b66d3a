"use client";

import { useActionState } from "react";
import type { FormState } from "@/components/ui/form-state";
import { buttonClass } from "@/components/ui/button";

type Action = (prev: FormState, form: FormData) => Promise<FormState>;

/** One small form on a list row (a hidden id, optional select, a button) with its own message below. */
export function RowAction({
  action,
  hidden,
  label,
  variant = "secondary",
  select,
  confirm,
}: {
  action: Action;
  hidden: Record<string, string>;
  label: string;
  variant?: "secondary" | "quiet" | "danger";
  select?: { name: string; label: string; options: readonly string[]; value: string };
  /** Asked before submitting (removals, revocations). */
  confirm?: string;
}) {
  const [state, formAction, pending] = useActionState(action, { status: "idle" } as FormState);
  return (
    <form
      action={formAction}
      onSubmit={(e) => {
        if (confirm && !window.confirm(confirm)) e.preventDefault();
      }}
      className="flex flex-col items-end gap-1"
    >
      <div className="flex items-center gap-2">
        {Object.entries(hidden).map(([k, v]) => (
          <input key={k} type="hidden" name={k} value={v} />
        ))}
        {select ? (
          <>
            <label className="sr-only" htmlFor={`${select.name}-${Object.values(hidden).join("-")}`}>
              {select.label}
            </label>
            <select
              id={`${select.name}-${Object.values(hidden).join("-")}`}
              name={select.name}
              defaultValue={select.value}
              className="rounded-md border border-line-strong bg-paper-raised px-2 py-1 text-sm"
            >
              {select.options.map((o) => (
                <option key={o} value={o}>
                  {o}
                </option>
              ))}
            </select>
          </>
        ) : null}
        <button type="submit" disabled={pending} className={buttonClass(variant, "px-2.5 py-1 text-xs")}>
          {label}
        </button>
      </div>
      <p aria-live="polite" className={`max-w-64 text-right text-xs ${state.status === "error" ? "text-brick-700" : "text-moss-700"}`}>
        {state.message}
      </p>
    </form>
  );
}
