"use server";

import { AuthError } from "next-auth";
import { headers } from "next/headers";
import { z } from "zod";
import { signIn, signOut } from "@/auth";
import { createUserWithWorkspace } from "@/db/queries/users";
import { hashPassword } from "@/server/auth/password";
import { checkRateLimit, clientAddress, refundAttempt, waitText } from "@/server/auth/rate-limit";
import { SIGN_IN_LINK_MINUTES, requestSignInLink } from "@/server/auth/sign-in-link";
import { isAppError } from "@/server/errors";
import { fieldErrorsOf, type FormState } from "@/components/ui/form-state";

const Email = z.string().trim().min(1, "Enter your e-mail address.").max(254).email("Enter a valid e-mail address.");

const SignUpInput = z.object({
  name: z.string().trim().min(1, "Enter your name.").max(100, "Use at most 100 characters."),
  email: Email,
  password: z
    .string()
    .min(10, "Use at least 10 characters.")
    .max(200, "Use at most 200 characters."),
  workspaceName: z.string().trim().max(100, "Use at most 100 characters.").optional(),
});

const SignInInput = z.object({
  email: Email,
  password: z.string().min(1, "Enter your password.").max(200),
  callbackUrl: z.string().optional(),
});

/** The form's answer past a rate limit (a server action cannot answer 429; the API endpoint does). */
function tooManyAttempts(what: string, seconds: number): string {
  return `Too many ${what} for this address or from this network. Try again in ${waitText(seconds)}.`;
}

/** Only same-site paths may follow a sign-in; anything else goes to the dashboard. */
function safeNext(url: string | undefined): string {
  return url && url.startsWith("/") && !url.startsWith("//") ? url : "/dashboard";
}

function text(form: FormData, name: string): string | undefined {
  const value = form.get(name);
  return typeof value === "string" ? value : undefined;
}

export type SignUpField = "name" | "email" | "password" | "workspaceName";

export async function signUpAction(_prev: FormState<SignUpField>, form: FormData): Promise<FormState<SignUpField>> {
  const raw = { name: text(form, "name"), email: text(form, "email"), password: text(form, "password"), workspaceName: text(form, "workspaceName") || undefined };
  const values = { name: raw.name ?? "", email: raw.email ?? "", workspaceName: raw.workspaceName ?? "" };
  const parsed = SignUpInput.safeParse(raw);
  if (!parsed.success)
    return { status: "error", message: "Please correct the fields marked below.", fieldErrors: fieldErrorsOf<SignUpField>(parsed.error.issues), values };
  const { name, email, password } = parsed.data;
  try {
    await createUserWithWorkspace({
      email,
      name,
      passwordHash: await hashPassword(password),
      workspaceName: parsed.data.workspaceName || `${name}'s atlas`,
    });
  } catch (err) {
    if (isAppError(err) && err.code === "conflict")
      return {
        status: "error",
        message: "That e-mail address already has an account.",
        fieldErrors: { email: ["An account with this e-mail address already exists. Sign in instead, or ask for a sign-in link."] },
        values,
      };
    return { status: "error", message: "Your account could not be created just now; nothing was saved. Please try again.", values };
  }
  await signIn("password", { email, password, redirectTo: "/dashboard" });
  return { status: "ok" };
}

export type SignInField = "email" | "password";

export async function signInAction(_prev: FormState<SignInField>, form: FormData): Promise<FormState<SignInField>> {
  const parsed = SignInInput.safeParse({ email: text(form, "email"), password: text(form, "password"), callbackUrl: text(form, "callbackUrl") });
  const values = { email: text(form, "email") ?? "" };
  if (!parsed.success)
    return { status: "error", message: "Please correct the fields marked below.", fieldErrors: fieldErrorsOf<SignInField>(parsed.error.issues), values };
  const attempt = { action: "sign-in" as const, email: parsed.data.email, address: clientAddress(await headers()) };
  const decision = await checkRateLimit(attempt);
  if (!decision.allowed) return { status: "error", message: tooManyAttempts("sign-in attempts", decision.retryAfterSeconds), values };
  try {
    await signIn("password", { email: parsed.data.email, password: parsed.data.password, redirectTo: safeNext(parsed.data.callbackUrl) });
  } catch (err) {
    // One message for an unknown address and a wrong password alike: the form reveals no accounts.
    if (err instanceof AuthError) return { status: "error", message: "That e-mail and password do not match an account.", values };
    // Anything else is the redirect of a successful sign-in: only failures count against the limit.
    await refundAttempt(attempt);
    throw err;
  }
  return { status: "ok" };
}

export async function requestLinkAction(_prev: FormState<"email">, form: FormData): Promise<FormState<"email">> {
  const parsed = z.object({ email: Email }).safeParse({ email: text(form, "email") });
  const values = { email: text(form, "email") ?? "" };
  if (!parsed.success) return { status: "error", fieldErrors: fieldErrorsOf<"email">(parsed.error.issues), values };
  // Counted whether or not the address has an account, so the answer tells nothing about accounts.
  const decision = await checkRateLimit({ action: "link", email: parsed.data.email, address: clientAddress(await headers()) });
  if (!decision.allowed) return { status: "error", message: tooManyAttempts("sign-in links", decision.retryAfterSeconds), values };
  try {
    await requestSignInLink({ email: parsed.data.email });
  } catch (err) {
    console.error("sign-in link not sent:", err);
    return { status: "error", message: "The sign-in link could not be sent just now. Please try again in a minute.", values };
  }
  return {
    status: "ok",
    message: `If an account uses ${parsed.data.email}, a sign-in link is on its way. It works once, within ${SIGN_IN_LINK_MINUTES} minutes.`,
    values,
  };
}

export async function consumeLinkAction(_prev: FormState, form: FormData): Promise<FormState> {
  const token = z.string().min(20).max(200).safeParse(text(form, "token"));
  if (!token.success) return { status: "error", message: "This sign-in link is incomplete. Copy the whole link from the e-mail, or ask for a new one." };
  try {
    await signIn("email-link", { token: token.data, redirectTo: "/dashboard" });
  } catch (err) {
    if (err instanceof AuthError) return { status: "error", message: "This sign-in link has expired or was already used. Ask for a new one below." };
    throw err;
  }
  return { status: "ok" };
}

export async function signOutAction(): Promise<void> {
  await signOut({ redirectTo: "/" });
}
