import Link from "next/link";

export type ModelRow = {
  id: string;
  name: string;
  kind: string;
  rule: number | null;
  symmetryClass: number | null;
  states: number | null;
  alphabet: number | null;
  radius: number | null;
  block: number | null;
  tags: string[];
};

function shape(m: ModelRow): string {
  if (m.states !== null) return `${m.states} states`;
  const parts = [m.alphabet !== null ? `k=${m.alphabet}` : null, m.radius !== null ? `r=${m.radius}` : null, m.block !== null ? `N=${m.block}` : null];
  return parts.filter(Boolean).join(", ");
}

export function ModelTable({ rows }: { rows: ModelRow[] }) {
  return (
    <table className="w-full border-collapse text-sm">
      <thead>
        <tr className="border-b border-line-strong text-left text-xs text-ink-faint">
          <th scope="col" className="py-1.5 pr-3 font-medium">Model</th>
          <th scope="col" className="py-1.5 pr-3 font-medium">Class</th>
          <th scope="col" className="py-1.5 pr-3 font-medium">Rule</th>
          <th scope="col" className="py-1.5 pr-3 font-medium">Symmetry class</th>
          <th scope="col" className="py-1.5 pr-3 font-medium">Size</th>
          <th scope="col" className="py-1.5 font-medium">Tags</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((m) => (
          <tr key={m.id} className="border-b border-line/70 hover:bg-tide-50/50">
            <td className="py-1.5 pr-3">
              <Link href={`/atlas/models/${m.id}`} className="font-medium text-tide-800 underline-offset-2 hover:underline">
                {m.name}
              </Link>
            </td>
            <td className="py-1.5 pr-3 font-mono text-xs text-ink-soft">{m.kind}</td>
            <td className="py-1.5 pr-3 font-mono tabular-nums">{m.rule ?? "—"}</td>
            <td className="py-1.5 pr-3 font-mono tabular-nums">
              {m.symmetryClass !== null ? (
                <Link href={`/atlas?class=${m.symmetryClass}`} className="underline-offset-2 hover:underline">
                  {m.symmetryClass}
                </Link>
              ) : (
                "—"
              )}
            </td>
            <td className="py-1.5 pr-3 font-mono text-xs text-ink-soft">{shape(m) || "—"}</td>
            <td className="py-1.5">
              <span className="flex flex-wrap gap-1">
                {m.tags.map((t) => (
                  <Link key={t} href={`/atlas?tag=${encodeURIComponent(t)}`} className="rounded-full bg-tide-50 px-2 py-0.5 text-xs text-tide-800 hover:bg-tide-100">
                    {t}
                  </Link>
                ))}
              </span>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** Tags are stored as a JSON array of strings; anything else reads as no tags. */
export function parseTags(text: string): string[] {
  try {
    const value: unknown = JSON.parse(text);
    return Array.isArray(value) ? value.filter((t): t is string => typeof t === "string") : [];
  } catch {
    return [];
  }
}
