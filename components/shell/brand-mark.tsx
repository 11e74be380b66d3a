/** Our mark: a commuting square — four corners joined by two paths that agree, the goal corner in saffron. */
export function BrandMark({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect x="0.5" y="0.5" width="31" height="31" rx="8" className="fill-tide-700" />
      <path d="M9 9H23V23M9 9V23H23" className="stroke-tide-100" strokeWidth="2.2" fill="none" strokeLinejoin="round" />
      <circle cx="9" cy="9" r="2.8" className="fill-tide-100" />
      <circle cx="23" cy="9" r="2.2" className="fill-tide-100" />
      <circle cx="9" cy="23" r="2.2" className="fill-tide-100" />
      <circle cx="23" cy="23" r="3.4" className="fill-saffron-300" />
    </svg>
  );
}
