import Link from "next/link";
import { MapKindBadge, StatusBadge } from "./map-badges";
import { describeDefinition } from "./mapDefinition";

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
  /** The projection or partition as JSON text, when the list knows it. */
  definition?: string | null;
  /** The source's state labels, when the list is not about one model (else the table's `labels`). */
  labels?: string[];
};

/** The projection as its symbols (with a familiar name), or the partition as blocks. */
function Definition({ row, labels }: { row: MapRow; labels?: string[] }) {
  const d = describeDefinition(row.kind, row.definition ?? null, row.block, row.labels ?? labels);
  if (!d) return null;
  return (
    <span className="mt-0.5 block text-xs text-ink-soft" title={d.title}>
      {d.name ? <span className="mr-1.5">{d.name}</span> : null}
      <span className="font-mono tracking-wider text-ink-faint">{d.symbols}</span>
    </span>
  );
}

function ModelLink({ model }: { model: { id: string; name: string } }) {
  return (
    <Link href={`/atlas/models/${model.id}`} className="font-medium text-tide-800 underline-offset-2 hover:underline">
      {model.name}
    </Link>
  );
}

/** Maps from or to one model: the other end, kind, block size, status. */
export function MapTable({ rows, otherHeading, empty, labels }: { rows: MapRow[]; otherHeading: string; empty: string; labels?: string[] }) {
  if (rows.length === 0) return <p className="text-sm text-ink-faint">{empty}</p>;
  const withSource = rows.some((r) => r.from);
  return (
    // Wide symbol strings scroll inside the table on a phone instead of widening the page; `relative` keeps
    // the screen-reader-only heading (absolutely placed) inside the scroller too.
    <div className="relative overflow-x-auto">
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
              <Definition row={row} labels={labels} />
            </td>
            <td className="py-1.5 pr-3">
              <StatusBadge status={row.status} />
            </td>
            <td className="py-1.5 text-right">
              <Link href={`/atlas/maps/${row.id}`} className="whitespace-nowrap text-xs text-ink-faint underline-offset-2 hover:underline">
                certificate →
              </Link>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
    </div>
  );
}
