"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import type { FormState } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";

type NewAccountState = FormState<"name" | "password">;

/** Signed out, no account yet: a name and a password create the invited account. */
export function AcceptNewAccountForm({ token, email, action }: { token: string; email: string; action: (prev: NewAccountState, form: FormData) => Promise<NewAccountState> }) {
  const [state, formAction] = useActionState(action, { status: "idle" } as NewAccountState);
  return (
    <form action={formAction} className="space-y-4" aria-describedby="accept-message">
      <input type="hidden" name="token" value={token} />
      <div className="space-y-1.5">
        <p className="block text-sm font-medium text-ink">E-mail address</p>
        <p className="rounded-md bg-paper px-3 py-2 font-mono text-sm text-ink-soft">{email}</p>
      </div>
      <Field name="name" label="Your name" autoComplete="name" defaultValue={state.values?.name} errors={state.fieldErrors?.name} required maxLength={100} />
      <Field name="password" type="password" label="Choose a password" hint="At least 10 characters." autoComplete="new-password" errors={state.fieldErrors?.password} required minLength={10} maxLength={200} />
      <FormMessage state={state} id="accept-message" />
      <SubmitButton pendingText="Joining…">Create account and join</SubmitButton>
    </form>
  );
}

/** Signed in as the invited address: one button. */
export function AcceptAsMemberForm({ token, label, action }: { token: string; label: string; action: (prev: FormState, form: FormData) => Promise<FormState> }) {
  const [state, formAction] = useActionState(action, { status: "idle" } as FormState);
  return (
    <form action={formAction} className="space-y-4" aria-describedby="accept-message">
      <input type="hidden" name="token" value={token} />
      <FormMessage state={state} id="accept-message" />
      <SubmitButton pendingText="Joining…">{label}</SubmitButton>
    </form>
  );
}
