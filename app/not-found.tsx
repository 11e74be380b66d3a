import Link from "next/link";
import { buttonClass } from "@/components/ui/button";

export default function NotFound() {
  return (
    <div className="mx-auto max-w-xl px-5 py-16">
      <p className="font-mono text-sm font-medium text-saffron-600">404 · not found</p>
      <h1 className="mt-2 text-3xl font-semibold tracking-tight text-tide-900">Nothing at this address</h1>
      <p className="mt-4 text-sm text-ink-soft">
        The page, model or map you asked for does not exist in this workspace, or its address was mistyped.
      </p>
      <div className="mt-8">
        <Link href="/dashboard" className={buttonClass("primary")}>
          Go to the dashboard
        </Link>
      </div>
    </div>
  );
}
