"use client";

import { useActionState } from "react";
import { consumeLinkAction } from "@/app/(auth)/actions";
import { FormMessage } from "@/components/ui/form-message";
import { IDLE } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";

/**
 * The link only opens this page; signing in takes a press of the button, so that mail scanners
 * that fetch every link cannot use up the one-time token.
 */
export function ConsumeLinkForm({ token }: { token: string }) {
  const [state, action] = useActionState(consumeLinkAction, IDLE);
  return (
    <form action={action} className="space-y-4" aria-describedby="form-message">
      <FormMessage state={state} />
      <input type="hidden" name="token" value={token} />
      <SubmitButton pendingText="Signing in…" className="w-full">
        Finish signing in
      </SubmitButton>
    </form>
  );
}
