import { Skeleton } from "./skeleton";

/** The shape of an atlas page while it loads: a title, then panels of grey bars. */
export function PageSkeleton({ label, panels = 3 }: { label: string; panels?: number }) {
  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8" role="status" aria-label={label}>
      <div className="space-y-2">
        <div className="h-3 w-16 animate-pulse rounded bg-line" />
        <div className="h-8 w-72 max-w-full animate-pulse rounded bg-line" />
      </div>
      {Array.from({ length: panels }, (_, i) => (
        <div key={i} className="rounded-[var(--radius-card)] border border-line bg-paper-raised p-5">
          <Skeleton lines={i === 0 ? 4 : 6} label={label} />
        </div>
      ))}
    </div>
  );
}
