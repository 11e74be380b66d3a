"use client";

import { useActionState } from "react";
import { signUpAction, type SignUpField } from "@/app/(auth)/actions";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { IDLE, type FormState } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";

export function SignUpForm() {
  const [state, action] = useActionState(signUpAction, IDLE as FormState<SignUpField>);
  return (
    <form action={action} className="space-y-4" noValidate aria-describedby="form-message">
      <FormMessage state={state} />
      <Field name="name" label="Your name" autoComplete="name" required defaultValue={state.values?.name} errors={state.fieldErrors?.name} />
      <Field name="email" label="E-mail" type="email" autoComplete="email" required defaultValue={state.values?.email} errors={state.fieldErrors?.email} />
      <Field name="password" label="Password" type="password" autoComplete="new-password" required hint="At least 10 characters." errors={state.fieldErrors?.password} />
      <Field
        name="workspaceName"
        label="Name of your first atlas (optional)"
        placeholder="e.g. Rule 146 study group"
        defaultValue={state.values?.workspaceName}
        errors={state.fieldErrors?.workspaceName}
      />
      <SubmitButton pendingText="Creating your account…" className="w-full">
        Create account
      </SubmitButton>
    </form>
  );
}
