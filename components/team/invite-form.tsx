"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import type { FormState } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";
import type { Role } from "@/lib/policy";

type InviteState = FormState<"email" | "role">;

/** The admin's invite form: an address and a role; errors sit next to their field. */
export function InviteForm({ roles, action }: { roles: readonly Role[]; action: (prev: InviteState, form: FormData) => Promise<InviteState> }) {
  const [state, formAction] = useActionState(action, { status: "idle" } as InviteState);
  const roleErrors = state.fieldErrors?.role;
  return (
    <form action={formAction} className="space-y-4" aria-describedby="invite-message">
      <Field name="email" type="email" label="E-mail address" autoComplete="off" defaultValue={state.status === "ok" ? "" : state.values?.email} errors={state.fieldErrors?.email} required maxLength={254} />
      <div className="space-y-1.5">
        <label htmlFor="invite-role" className="block text-sm font-medium text-ink">
          Role
        </label>
        <select
          id="invite-role"
          name="role"
          defaultValue={state.values?.role ?? "contributor"}
          aria-invalid={roleErrors?.length ? true : undefined}
          aria-describedby="invite-role-error"
          className="block w-full rounded-md border border-line-strong bg-paper-raised px-3 py-2 text-sm text-ink"
        >
          {roles.map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </select>
        <div id="invite-role-error" aria-live="polite">
          {roleErrors?.map((e) => (
            <p key={e} className="text-sm text-brick-700">
              {e}
            </p>
          ))}
        </div>
      </div>
      <FormMessage state={state} id="invite-message" />
      <SubmitButton pendingText="Sending…">Send invitation</SubmitButton>
    </form>
  );
}
