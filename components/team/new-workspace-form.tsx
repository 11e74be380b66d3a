"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import type { FormState } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";

type State = FormState<"name">;

export function NewWorkspaceForm({ action }: { action: (prev: State, form: FormData) => Promise<State> }) {
  const [state, formAction] = useActionState(action, { status: "idle" } as State);
  return (
    <form action={formAction} className="space-y-4" aria-describedby="workspace-message">
      <Field name="name" label="Name" hint="For example the group or the project." defaultValue={state.values?.name} errors={state.fieldErrors?.name} required maxLength={100} />
      <FormMessage state={state} id="workspace-message" />
      <SubmitButton pendingText="Creating…">Create workspace</SubmitButton>
    </form>
  );
}
