"use client";

import { useActionState } from "react";
import { postNoteAction } from "@/app/dashboard/actions";
import { FormMessage } from "@/components/ui/form-message";
import { IDLE, type FormState } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";

export function NoteForm() {
  const [state, action] = useActionState(postNoteAction, IDLE as FormState<"text">);
  const errors = state.fieldErrors?.text;
  return (
    <form action={action} className="space-y-3" noValidate>
      <label htmlFor="text" className="block text-sm font-medium">
        Add a note to the log
      </label>
      <textarea
        id="text"
        name="text"
        rows={2}
        maxLength={500}
        defaultValue={state.status === "ok" ? "" : state.values?.text}
        aria-invalid={errors ? true : undefined}
        aria-describedby="text-error note-message"
        placeholder="e.g. Rule 146 at block 3: checking the projection onto rule 90 next."
        className={`block w-full resize-y rounded-md border bg-paper-raised px-3 py-2 text-sm placeholder:text-ink-faint focus:border-tide-600 focus:outline-none focus:ring-2 focus:ring-tide-100 ${errors ? "border-brick-600" : "border-line-strong"}`}
      />
      <div id="text-error" aria-live="polite" aria-atomic="true">
        {errors?.map((e) => (
          <p key={e} className="text-sm text-brick-700">
            {e}
          </p>
        ))}
      </div>
      <div className="flex items-center justify-between gap-3">
        <FormMessage state={state} id="note-message" />
        <SubmitButton pendingText="Adding…">Add note</SubmitButton>
      </div>
    </form>
  );
}
