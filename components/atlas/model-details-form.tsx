"use client";

import { useActionState } from "react";
import type { FormState } from "@/components/ui/form-state";

type Field = "name" | "description";

/** A contributor's form for a model's display name and short description in this workspace. */
export function ModelDetailsForm({
  action,
  name,
  description,
}: {
  action: (state: FormState<Field>, form: FormData) => Promise<FormState<Field>>;
  name: string;
  description: string;
}) {
  const [state, formAction, pending] = useActionState(action, { status: "idle" } as FormState<Field>);
  const errors = state.fieldErrors ?? {};
  const input = (field: Field) => ({
    id: `model-${field}`,
    name: field,
    "aria-invalid": errors[field] ? true : undefined,
    "aria-describedby": `model-${field}-error`,
    className: `block w-full rounded-md border bg-paper-raised px-3 py-2 text-sm ${errors[field] ? "border-brick-600" : "border-line-strong"}`,
  });
  return (
    <form action={formAction} className="space-y-3">
      <div className="space-y-1">
        <label htmlFor="model-name" className="block text-sm font-medium">
          Name
        </label>
        <input {...input("name")} defaultValue={state.values?.name ?? name} maxLength={120} required />
        <p id="model-name-error" aria-live="polite" className="text-sm text-brick-700">
          {errors.name?.join(" ")}
        </p>
      </div>
      <div className="space-y-1">
        <label htmlFor="model-description" className="block text-sm font-medium">
          Description
        </label>
        <textarea {...input("description")} rows={3} defaultValue={state.values?.description ?? description} maxLength={2000} />
        <p id="model-description-error" aria-live="polite" className="text-sm text-brick-700">
          {errors.description?.join(" ")}
        </p>
      </div>
      {state.message ? (
        <p role={state.status === "error" ? "alert" : "status"} className={`rounded-md px-3 py-2 text-sm ${state.status === "error" ? "bg-brick-50 text-brick-700" : "bg-moss-50 text-moss-700"}`}>
          {state.message}
        </p>
      ) : null}
      <button type="submit" disabled={pending} className="rounded-md bg-tide-700 px-3 py-1.5 text-sm font-semibold text-paper-raised hover:bg-tide-800 disabled:opacity-60">
        {pending ? "Saving…" : "Save name and description"}
      </button>
    </form>
  );
}
