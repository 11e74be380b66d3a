/** The kind of a map with its block size and steps, e.g. "coarse-graining · N=3 · T=3". */
export function MapKindBadge({ kind, block, steps }: { kind: string; block: number | null; steps: number | null }) {
  return (
    <span className="inline-flex items-center gap-1 rounded border border-stone-300 bg-stone-50 px-1.5 py-0.5 font-mono text-xs text-stone-700">
      {kind}
      {block !== null ? <span className="text-stone-500">· N={block}</span> : null}
      {steps !== null && steps !== block ? <span className="text-stone-500">· T={steps}</span> : null}
    </span>
  );
}

export function StatusBadge({ status }: { status: "certified" | "retracted" }) {
  return status === "certified" ? (
    <span className="rounded bg-emerald-50 px-1.5 py-0.5 text-xs font-medium text-emerald-800 ring-1 ring-emerald-200">certified</span>
  ) : (
    <span className="rounded bg-amber-50 px-1.5 py-0.5 text-xs font-medium text-amber-900 ring-1 ring-amber-300">retracted</span>
  );
}
