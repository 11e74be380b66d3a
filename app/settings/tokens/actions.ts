"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { fieldErrorsOf, type FormState } from "@/components/ui/form-state";
import { ROLES } from "@/lib/policy";
import { requireAction } from "@/server/context";
import { isAppError } from "@/server/errors";
import { createPersonalToken, revokePersonalToken } from "@/server/tokens";

const CreateTokenForm = z.object({
  name: z.string().trim().min(1, "Name the token, e.g. after the notebook that uses it.").max(100, "Keep the name under 100 characters."),
  role: z.enum(ROLES, { message: "Choose a role." }),
});

export type TokenFormState = FormState<"name" | "role"> & { secret?: string };

/** Creates a token; the secret is in the returned state once and never again. */
export async function createTokenAction(_state: TokenFormState, form: FormData): Promise<TokenFormState> {
  const { user, workspace } = await requireAction("token:manage");
  const values = { name: String(form.get("name") ?? ""), role: String(form.get("role") ?? "") };
  const parsed = CreateTokenForm.safeParse(values);
  if (!parsed.success) return { status: "error", fieldErrors: fieldErrorsOf(parsed.error.issues), values };
  try {
    const { secret } = await createPersonalToken({ userId: user.id, workspaceId: workspace.id, ...parsed.data });
    revalidatePath("/settings/tokens");
    return { status: "ok", message: "Copy the token now: it is shown only this once.", secret };
  } catch (err) {
    if (isAppError(err)) {
      return err.field === "role"
        ? { status: "error", fieldErrors: { role: [err.message] }, values }
        : { status: "error", message: err.message, values };
    }
    throw err;
  }
}

/**
 * Revokes one of the signed-in person's own tokens, then shows the list with the outcome. The id is
 * a bound argument, which the browser sends back in the form and anyone can change: an id that is
 * not one of the person's tokens revokes nothing and says so (`?revoke=unknown`).
 */
export async function revokeTokenAction(tokenId: unknown): Promise<void> {
  const { user } = await requireAction("token:manage");
  const id = z.string().min(1).max(100).safeParse(tokenId);
  let outcome: "revoked" | "unknown" = "unknown";
  if (id.success) {
    try {
      await revokePersonalToken({ userId: user.id, tokenId: id.data });
      outcome = "revoked";
    } catch (err) {
      if (!isAppError(err) || err.code !== "not_found") throw err;
    }
  }
  revalidatePath("/settings/tokens");
  redirect(`/settings/tokens?revoke=${outcome}`);
}
