import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { CommutingSquare } from "@/components/landing/commuting-square";
import { getSessionUser } from "@/server/context";

const POINTS = [
  {
    title: "Submit a certificate",
    text: "A coarse-graining arrives as a certificate: the fine model, the coarse one, the block size and the projection or partition.",
  },
  {
    title: "Every square is checked",
    text: "The server checks the square exhaustively, in exact rationals, before an edge enters the atlas. A failing square comes back with its counterexample.",
  },
  {
    title: "Chains compose",
    text: "Paste certified squares into chains, ask which models reach which, and cite the certificate by its content address.",
  },
];

export default async function LandingPage() {
  const user = await getSessionUser();
  return (
    <div className="mx-auto max-w-6xl px-5">
      <section className="grid items-center gap-10 py-14 md:grid-cols-[1.2fr_1fr] md:py-20">
        <div>
          <p className="mb-4 inline-flex rounded-full bg-saffron-100 px-3 py-1 text-xs font-semibold uppercase tracking-wider text-saffron-700">
            Markov chains · elementary CAs · 1-D CAs
          </p>
          <h1 className="text-4xl font-semibold leading-tight tracking-tight text-tide-900 md:text-5xl">
            A shared atlas of coarse-grainings, checked by machine.
          </h1>
          <p className="mt-5 max-w-xl text-lg leading-relaxed text-ink-soft">
            Squarely is where a research team records which dynamical models coarse-grain onto which — lumpings,
            decimations, supercell blockings, projections — and keeps only the squares that commute.
          </p>
          <div className="mt-8 flex flex-wrap gap-3">
            {user ? (
              <Link href="/dashboard" className={buttonClass("primary", "px-5 py-2.5")}>
                Open your dashboard
              </Link>
            ) : (
              <>
                <Link href="/sign-in" className={buttonClass("primary", "px-5 py-2.5")}>
                  Sign in
                </Link>
                <Link href="/sign-up" className={buttonClass("secondary", "px-5 py-2.5")}>
                  Create an account
                </Link>
              </>
            )}
          </div>
        </div>
        <CommutingSquare />
      </section>
      <section className="grid gap-5 border-t border-line py-12 md:grid-cols-3">
        {POINTS.map((p, i) => (
          <div key={p.title}>
            <p className="font-mono text-sm text-saffron-500">0{i + 1}</p>
            <h2 className="mt-1 text-lg font-semibold text-tide-900">{p.title}</h2>
            <p className="mt-2 text-sm leading-relaxed text-ink-soft">{p.text}</p>
          </div>
        ))}
      </section>
    </div>
  );
}
