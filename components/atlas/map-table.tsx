import Link from "next/link";
import { MapKindBadge, StatusBadge } from "./map-badges";

export type MapRow = {
  id: string;
  kind: string;
  block: number | null;
  steps: number | null;
  summary: string;
  status: "certified" | "retracted";
  derivation?: string | null;
  /** The model at the other end from the page's model. */
  other: { id: string; name: string };
  /** Set when the list is not about one model: the source, with `other` the target. */
  from?: { id: string; name: string };
};

function ModelLink({ model }: { model: { id: string; name: string } }) {
  return (
    <Link href={`/atlas/models/${model.id}`} className="font-medium text-tide-800 underline-offset-2 hover:underline">
      {model.name}
    </Link>
  );
}

/** Maps from or to one model: the other end, kind, block size, status. */
export function MapTable({ rows, otherHeading, empty }: { rows: MapRow[]; otherHeading: string; empty: string }) {
  if (rows.length === 0) return <p className="text-sm text-ink-faint">{empty}</p>;
  const withSource = rows.some((r) => r.from);
  return (
    <table className="w-full border-collapse text-sm">
      <thead>
        <tr className="border-b border-line-strong text-left text-xs text-ink-faint">
          {withSource ? (
            <th scope="col" className="py-1 pr-3 font-medium">
              Source
            </th>
          ) : null}
          <th scope="col" className="py-1 pr-3 font-medium">{otherHeading}</th>
          <th scope="col" className="py-1 pr-3 font-medium">Map</th>
          <th scope="col" className="py-1 pr-3 font-medium">Status</th>
          <th scope="col" className="py-1 font-medium">
            <span className="sr-only">Certificate</span>
          </th>
        </tr>
      </thead>
      <tbody>
        {rows.map((row) => (
          <tr key={row.id} className="border-b border-line align-top">
            {withSource ? <td className="py-1.5 pr-3">{row.from ? <ModelLink model={row.from} /> : null}</td> : null}
            <td className="py-1.5 pr-3">
              <ModelLink model={row.other} />
            </td>
            <td className="py-1.5 pr-3">
              <MapKindBadge kind={row.kind} block={row.block} steps={row.steps} />
              {row.derivation ? <span className="ml-1 text-xs text-ink-faint">by {row.derivation}</span> : null}
            </td>
            <td className="py-1.5 pr-3">
              <StatusBadge status={row.status} />
            </td>
            <td className="py-1.5 text-right">
              <Link href={`/atlas/maps/${row.id}`} className="text-xs text-ink-faint underline-offset-2 hover:underline">
                certificate →
              </Link>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
