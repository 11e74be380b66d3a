import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { SignUpForm } from "@/components/auth/sign-up-form";
import { getSessionUser } from "@/server/context";

export const metadata: Metadata = { title: "Create an account" };

export default async function SignUpPage() {
  if (await getSessionUser()) redirect("/dashboard");
  return (
    <>
      <h1 className="text-2xl font-semibold tracking-tight">Create an account</h1>
      <p className="mb-6 mt-1.5 text-sm text-ink-soft">You get an atlas of your own, where you are the admin. Colleagues can add you to theirs.</p>
      <SignUpForm />
      <p className="mt-6 text-sm text-ink-soft">
        Already have an account?{" "}
        <Link href="/sign-in" className="font-medium text-tide-700 underline underline-offset-2">
          Sign in
        </Link>
      </p>
    </>
  );
}
