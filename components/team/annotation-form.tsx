"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import type { FormState } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";

type State = FormState<"text" | "kind">;

/** Add a note, a tag, or (maps) a "published in" DOI or arXiv identifier. */
export function AnnotationForm({ subjectType, subjectId, action }: { subjectType: "model" | "map"; subjectId: string; action: (prev: State, form: FormData) => Promise<State> }) {
  const [state, formAction] = useActionState(action, { status: "idle" } as State);
  return (
    <form action={formAction} className="space-y-3" aria-describedby="annotation-message">
      <input type="hidden" name="subjectType" value={subjectType} />
      <input type="hidden" name="subjectId" value={subjectId} />
      <div className="space-y-1.5">
        <label htmlFor="annotation-kind" className="block text-sm font-medium text-ink">
          Add
        </label>
        <select id="annotation-kind" name="kind" defaultValue={state.values?.kind ?? "note"} className="block w-full rounded-md border border-line-strong bg-paper-raised px-3 py-2 text-sm">
          <option value="note">a note</option>
          <option value="tag">a tag</option>
          {subjectType === "map" ? <option value="published">published in (DOI or arXiv)</option> : null}
        </select>
      </div>
      <Field name="text" label="Text" hint="A tag: lower-case words with hyphens. Published in: e.g. 10.1103/PhysRevE.73.026203 or 1501.00001." defaultValue={state.status === "ok" ? "" : state.values?.text} errors={state.fieldErrors?.text} maxLength={1000} />
      <FormMessage state={state} id="annotation-message" />
      <SubmitButton pendingText="Adding…">Add</SubmitButton>
    </form>
  );
}
