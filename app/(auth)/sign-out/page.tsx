import type { Metadata } from "next";
import Link from "next/link";
import { signOutAction } from "@/app/(auth)/actions";
import { buttonClass } from "@/components/ui/button";
import { getSessionUser } from "@/server/context";

export const metadata: Metadata = { title: "Sign out" };

export default async function SignOutPage() {
  const user = await getSessionUser();
  if (!user)
    return (
      <>
        <h1 className="text-2xl font-semibold tracking-tight">You are signed out</h1>
        <p className="mt-3 text-sm text-ink-soft">
          <Link href="/sign-in" className="font-medium text-tide-700 underline underline-offset-2">
            Sign in again
          </Link>
        </p>
      </>
    );
  return (
    <>
      <h1 className="text-2xl font-semibold tracking-tight">Sign out</h1>
      <p className="mb-6 mt-1.5 text-sm text-ink-soft">
        You are signed in as <strong className="font-medium text-ink">{user.email}</strong>.
      </p>
      <form action={signOutAction} className="flex gap-3">
        <button type="submit" className={buttonClass("primary")}>
          Sign out
        </button>
        <Link href="/dashboard" className={buttonClass("secondary")}>
          Stay signed in
        </Link>
      </form>
    </>
  );
}
