"use server";

import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";
import { signIn } from "@/auth";
import { fieldErrorsOf, type FormState } from "@/components/ui/form-state";
import { hashPassword } from "@/server/auth/password";
import { WORKSPACE_COOKIE, getSessionUser } from "@/server/context";
import { isAppError } from "@/server/errors";
import { acceptInvitation } from "@/server/team/invitations";

const Token = z.string().min(20, "This invitation link is incomplete: copy the whole link from the mail.").max(200);
const NewAccount = z.object({
  token: Token,
  name: z.string().trim().min(1, "Enter your name.").max(100, "Use at most 100 characters."),
  password: z.string().min(10, "Use at least 10 characters.").max(200, "Use at most 200 characters."),
});

export type AcceptField = "name" | "password";

function text(form: FormData, name: string): string {
  const v = form.get(name);
  return typeof v === "string" ? v : "";
}

async function rememberWorkspace(workspaceId: string): Promise<void> {
  (await cookies()).set(WORKSPACE_COOKIE, workspaceId, { httpOnly: true, sameSite: "lax", path: "/", maxAge: 60 * 60 * 24 * 365 });
}

/** Signed out: creates the invited account, joins, and signs in. */
export async function acceptAsNewAccountAction(_prev: FormState<AcceptField>, form: FormData): Promise<FormState<AcceptField>> {
  const values = { name: text(form, "name") };
  const parsed = NewAccount.safeParse({ token: text(form, "token"), name: text(form, "name"), password: text(form, "password") });
  if (!parsed.success) return { status: "error", fieldErrors: fieldErrorsOf<AcceptField>(parsed.error.issues), values };
  let email: string;
  try {
    const joined = await acceptInvitation({ token: parsed.data.token, newAccount: { name: parsed.data.name, passwordHash: await hashPassword(parsed.data.password) } });
    email = joined.email;
    await rememberWorkspace(joined.workspaceId);
  } catch (err) {
    if (isAppError(err)) return { status: "error", message: err.message, values };
    throw err;
  }
  await signIn("password", { email, password: parsed.data.password, redirectTo: "/dashboard" });
  return { status: "ok" };
}

/** Signed in as the invited address: joins and opens the workspace. */
export async function acceptAsMemberAction(_prev: FormState, form: FormData): Promise<FormState> {
  const user = await getSessionUser();
  if (!user) return { status: "error", message: "Sign in first." };
  const token = Token.safeParse(text(form, "token"));
  if (!token.success) return { status: "error", message: token.error.issues[0].message };
  try {
    const joined = await acceptInvitation({ token: token.data, userId: user.id });
    await rememberWorkspace(joined.workspaceId);
  } catch (err) {
    if (isAppError(err)) return { status: "error", message: err.message };
    throw err;
  }
  redirect("/dashboard");
}
