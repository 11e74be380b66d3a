export function Panel({ title, action, children, className = "" }: { title?: string; action?: React.ReactNode; children: React.ReactNode; className?: string }) {
  return (
    <section className={`rounded-[var(--radius-card)] border border-line bg-paper-raised p-5 shadow-sm shadow-black/[0.03] ${className}`}>
      {title ? (
        <div className="mb-4 flex items-center justify-between gap-4">
          <h2 className="text-sm font-semibold uppercase tracking-wider text-ink-soft">{title}</h2>
          {action}
        </div>
      ) : null}
      {children}
    </section>
  );
}
