/** The heading block of an atlas page: an eyebrow line, the title, and an optional lead and actions. */
export function PageHeader({
  eyebrow,
  title,
  lead,
  actions,
}: {
  eyebrow?: React.ReactNode;
  title: React.ReactNode;
  lead?: React.ReactNode;
  actions?: React.ReactNode;
}) {
  return (
    <header className="flex flex-wrap items-end justify-between gap-4">
      <div className="min-w-0">
        {eyebrow ? <p className="text-sm text-ink-soft">{eyebrow}</p> : null}
        <h1 className="mt-1 text-3xl font-semibold tracking-tight text-tide-900">{title}</h1>
        {lead ? <p className="mt-2 max-w-3xl text-sm text-ink-soft">{lead}</p> : null}
      </div>
      {actions ? <div className="flex flex-wrap items-start gap-2">{actions}</div> : null}
    </header>
  );
}
