"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import type { Role } from "@/lib/policy";
import { createTokenAction, type TokenFormState } from "./actions";

const INITIAL: TokenFormState = { status: "idle" };

/** The create form; after success it shows the secret once, ready to copy. */
export function TokenForm({ roles, defaultRole }: { roles: readonly Role[]; defaultRole: Role }) {
  const [state, action] = useActionState(createTokenAction, INITIAL);
  const roleErrors = state.fieldErrors?.role;
  return (
    <form action={action} className="space-y-4" aria-describedby="form-message">
      <Field name="name" label="Name" hint="Where the token is used, e.g. “lumping notebook”." defaultValue={state.values?.name} errors={state.fieldErrors?.name} required maxLength={100} />
      <div className="space-y-1.5">
        <label htmlFor="role" className="block text-sm font-medium text-ink">
          Role
        </label>
        <select
          id="role"
          name="role"
          defaultValue={state.values?.role ?? defaultRole}
          aria-invalid={roleErrors?.length ? true : undefined}
          aria-describedby="role-hint role-error"
          className="block w-full rounded-md border border-line-strong bg-paper-raised px-3 py-2 text-sm text-ink"
        >
          {roles.map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </select>
        <p id="role-hint" className="text-xs text-ink-faint">
          At most your own role; a viewer token can only read.
        </p>
        <div id="role-error" aria-live="polite">
          {roleErrors?.map((e) => (
            <p key={e} className="text-sm text-brick-700">
              {e}
            </p>
          ))}
        </div>
      </div>
      <FormMessage state={state} />
      {state.secret ? (
        <div className="space-y-1">
          <label htmlFor="new-token" className="block text-sm font-medium text-ink">
            Your new token
          </label>
          <input id="new-token" readOnly value={state.secret} className="block w-full rounded-md border border-line-strong bg-paper px-3 py-2 font-mono text-sm" onFocus={(e) => e.currentTarget.select()} />
        </div>
      ) : null}
      <SubmitButton pendingText="Creating…">Create token</SubmitButton>
    </form>
  );
}
