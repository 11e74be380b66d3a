import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { getSessionUser } from "@/server/context";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string | string[] }> }) {
  const { callbackUrl } = await searchParams;
  const next = typeof callbackUrl === "string" ? toPath(callbackUrl) : undefined;
  if (await getSessionUser()) redirect(next ?? "/dashboard");
  return (
    <>
      <h1 className="text-2xl font-semibold tracking-tight">Sign in</h1>
      <p className="mb-6 mt-1.5 text-sm text-ink-soft">Welcome back to the atlas.</p>
      <SignInForm callbackUrl={next} />
      <div className="mt-6 space-y-2 text-sm text-ink-soft">
        <p>
          No password at hand?{" "}
          <Link href="/sign-in-by-link" className="font-medium text-tide-700 underline underline-offset-2">
            Get a sign-in link by e-mail
          </Link>
        </p>
        <p>
          New here?{" "}
          <Link href="/sign-up" className="font-medium text-tide-700 underline underline-offset-2">
            Create an account
          </Link>
        </p>
      </div>
    </>
  );
}

/** The proxy passes an absolute URL; keep only its path, so a sign-in never leads off the site. */
function toPath(url: string): string | undefined {
  try {
    const parsed = new URL(url, "http://squarely.invalid");
    return parsed.pathname.startsWith("/") && !parsed.pathname.startsWith("//") ? parsed.pathname + parsed.search : undefined;
  } catch {
    return undefined;
  }
}
