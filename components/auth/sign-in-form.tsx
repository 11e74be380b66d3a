"use client";

import { useActionState } from "react";
import { signInAction, type SignInField } from "@/app/(auth)/actions";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { IDLE, type FormState } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";

export function SignInForm({ callbackUrl }: { callbackUrl?: string }) {
  const [state, action] = useActionState(signInAction, IDLE as FormState<SignInField>);
  return (
    <form action={action} className="space-y-4" noValidate aria-describedby="form-message">
      <FormMessage state={state} />
      {callbackUrl ? <input type="hidden" name="callbackUrl" value={callbackUrl} /> : null}
      <Field name="email" label="E-mail" type="email" autoComplete="email" required defaultValue={state.values?.email} errors={state.fieldErrors?.email} />
      <Field name="password" label="Password" type="password" autoComplete="current-password" required errors={state.fieldErrors?.password} />
      <SubmitButton pendingText="Signing in…" className="w-full">
        Sign in
      </SubmitButton>
    </form>
  );
}
