"use client";

import { useActionState } from "react";
import { FormMessage } from "@/components/ui/form-message";
import type { FormState } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";

/** The admin's switch for the public read-only view. */
export function PublicViewForm({ on, url, action }: { on: boolean; url: string; action: (prev: FormState, form: FormData) => Promise<FormState> }) {
  const [state, formAction] = useActionState(action, { status: "idle" } as FormState);
  return (
    <form action={formAction} className="space-y-3">
      <input type="hidden" name="publicView" value={on ? "off" : "on"} />
      <p className="text-sm text-ink-soft">
        {on ? (
          <>
            Anyone can read this atlas at{" "}
            <a href={url} className="break-all font-mono text-xs text-tide-700 underline">
              {url}
            </a>
            , without signing in. Members, mail addresses and tokens are never shown there.
          </>
        ) : (
          "Only members can read this atlas. Turn the public view on to share models and certified maps read-only, without the member list."
        )}
      </p>
      <FormMessage state={state} id="public-view-message" />
      <SubmitButton pendingText="Saving…">{on ? "Turn the public view off" : "Turn the public view on"}</SubmitButton>
    </form>
  );
}
