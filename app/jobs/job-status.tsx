import type { JobView } from "@/server/jobs/queue";

const TONES: Record<JobView["status"], string> = {
  queued: "bg-line/60 text-ink-soft",
  running: "bg-tide-100 text-tide-800",
  succeeded: "bg-moss-50 text-moss-700",
  failed: "bg-brick-50 text-brick-700",
  cancelled: "bg-saffron-100 text-saffron-700",
};

export function JobStatusBadge({ status }: { status: JobView["status"] }) {
  return <span className={`inline-flex rounded-full px-2 py-0.5 text-xs font-semibold ${TONES[status]}`}>{status}</span>;
}

/** A determinate bar; `label` names what it measures for screen readers. */
export function ProgressBar({ value, label }: { value: number; label: string }) {
  const percent = Math.round(Math.min(1, Math.max(0, value)) * 100);
  return (
    <div
      role="progressbar"
      aria-label={label}
      aria-valuemin={0}
      aria-valuemax={100}
      aria-valuenow={percent}
      className="h-2 w-full overflow-hidden rounded-full bg-line/60"
    >
      <div className="h-full rounded-full bg-tide-600 transition-[width] duration-500" style={{ width: `${percent}%` }} />
    </div>
  );
}
