/** The kind of a map with its block size and steps, e.g. "coarse-graining · N=3 · T=3". */
export function MapKindBadge({ kind, block, steps }: { kind: string; block: number | null; steps: number | null }) {
  return (
    <span
      title="N: block size, the fine cells per coarse cell; T: fine steps per coarse step"
      className="inline-flex items-center gap-1 whitespace-nowrap rounded border border-line-strong bg-paper px-1.5 py-0.5 font-mono text-xs text-ink-soft"
    >
      {kind}
      {block !== null ? <span className="text-ink-faint">· N={block}</span> : null}
      {steps !== null && steps !== block && !(block === null && steps === 1) ? <span className="text-ink-faint">· T={steps}</span> : null}
    </span>
  );
}

export function StatusBadge({ status }: { status: "certified" | "retracted" }) {
  return status === "certified" ? (
    <span className="rounded bg-moss-50 px-1.5 py-0.5 text-xs font-medium text-moss-700 ring-1 ring-moss-700/30">certified</span>
  ) : (
    <span className="rounded bg-saffron-100 px-1.5 py-0.5 text-xs font-medium text-saffron-700 ring-1 ring-saffron-300">retracted</span>
  );
}
