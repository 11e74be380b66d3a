import type { Metadata } from "next";
import Link from "next/link";
import { ConsumeLinkForm } from "@/components/auth/consume-link-form";
import { RequestLinkForm } from "@/components/auth/request-link-form";

export const metadata: Metadata = { title: "Sign in by e-mail link" };

export default async function SignInByLinkPage({ searchParams }: { searchParams: Promise<{ token?: string | string[] }> }) {
  const { token } = await searchParams;
  if (typeof token === "string" && token.length > 0)
    return (
      <>
        <h1 className="text-2xl font-semibold tracking-tight">Finish signing in</h1>
        <p className="mb-6 mt-1.5 text-sm text-ink-soft">Your link is ready. It works once; press the button to use it.</p>
        <ConsumeLinkForm token={token} />
        <div className="mt-8 border-t border-line pt-6">
          <h2 className="mb-3 text-sm font-semibold text-ink-soft">Link expired? Ask for a new one</h2>
          <RequestLinkForm />
        </div>
      </>
    );
  return (
    <>
      <h1 className="text-2xl font-semibold tracking-tight">Sign in by e-mail link</h1>
      <p className="mb-6 mt-1.5 text-sm text-ink-soft">We send a one-time link to the address of your account. No password needed.</p>
      <RequestLinkForm />
      <p className="mt-6 text-sm text-ink-soft">
        <Link href="/sign-in" className="font-medium text-tide-700 underline underline-offset-2">
          Sign in with a password instead
        </Link>
      </p>
    </>
  );
}
