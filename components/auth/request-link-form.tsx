"use client";

import { useActionState } from "react";
import { requestLinkAction } from "@/app/(auth)/actions";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { IDLE, type FormState } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";

export function RequestLinkForm() {
  const [state, action] = useActionState(requestLinkAction, IDLE as FormState<"email">);
  return (
    <form action={action} className="space-y-4" noValidate aria-describedby="form-message">
      <FormMessage state={state} />
      <Field name="email" label="E-mail" type="email" autoComplete="email" required defaultValue={state.values?.email} errors={state.fieldErrors?.email} />
      <SubmitButton pendingText="Sending…" className="w-full">
        E-mail me a sign-in link
      </SubmitButton>
    </form>
  );
}
