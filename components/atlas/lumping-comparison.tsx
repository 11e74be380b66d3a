import Link from "next/link";
import { coarsestLumping } from "@/lib/discovery";
import { formatRational, parseRational } from "@/lib/rational";
import { MatrixTable } from "./matrix-table";
import { PAGE_LUMPING_MAX_STATES, blocksOf, compareLumpings, comparisonSentence, startingLabels } from "./lumpingComparison";

/** A block named by its states, shortened to its number when that would not fit a table heading. */
const blockName = (states: string[], b: number) => (states.join(" + ").length <= 24 ? states.join(" + ") : `block ${b + 1}`);

function LumpingColumn({ title, source, labels, partition, lumped }: { title: string; source: string; labels: string[]; partition: number[]; lumped: string[][] | null }) {
  const blocks = blocksOf(partition, labels);
  return (
    <figure className="min-w-0 space-y-2">
      <figcaption>
        <span className="text-sm font-medium">{title}</span> <span className="text-xs text-ink-faint">({source})</span>
      </figcaption>
      <ol className="space-y-0.5 text-sm">
        {blocks.map((states, b) => (
          <li key={b}>
            <span className="text-xs text-ink-faint">block {b + 1}:</span> {`{${states.join(", ")}}`}
          </li>
        ))}
      </ol>
      {lumped ? <MatrixTable labels={blocks.map(blockName)} matrix={lumped} caption="Lumped chain Q, exact" /> : null}
    </figure>
  );
}

/**
 * The coarsest strong (Kemeny & Snell 1960, §6.3) and the coarsest exact (Buchholz 1994) lumping of a chain from one
 * starting partition, computed while the page renders (bounded by PAGE_LUMPING_MAX_STATES), and how they compare.
 */
export function LumpingComparison({ path, labels, matrix, keep }: { path: string; labels: string[]; matrix: string[][]; keep: number[] }) {
  if (matrix.length > PAGE_LUMPING_MAX_STATES)
    return (
      <p className="text-sm text-ink-faint">
        This chain has {matrix.length} states; the page lumps chains of at most {PAGE_LUMPING_MAX_STATES} states while it renders. Start the lumping job below, or use{" "}
        <span className="font-mono">npm run --silent cli -- lump FILE [--exact]</span>.
      </p>
    );
  let chain;
  try {
    chain = matrix.map((row) => row.map(parseRational));
  } catch {
    return <p className="text-sm text-ink-faint">This matrix could not be read as exact rationals.</p>;
  }
  const start = startingLabels(matrix.length, keep);
  const strong = coarsestLumping({ chain, labels: start });
  const exact = coarsestLumping({ chain, labels: start, exact: true });
  const format = (q: typeof strong.lumped) => q?.map((row) => row.map(formatRational)) ?? null;
  const relation = compareLumpings(strong.partition, exact.partition);
  return (
    <div className="space-y-4">
      <p className="text-sm text-ink-soft">
        {keep.length === 0 ? (
          <>
            Both start from one block holding every state. Every row of P sums to 1, so from there the coarsest strong lumping is always that single block; the
            exact one (equal column sums) need not be. Keep states apart to see more.
          </>
        ) : (
          <>
            Both start with {keep.map((i) => labels[i] ?? i).join(", ")} {keep.length === 1 ? "in a block of its own" : "each in a block of its own"} and the other
            states together.
          </>
        )}
      </p>
      <p className="text-sm font-medium">{comparisonSentence(relation, strong.blocks, exact.blocks)}</p>
      <div className="grid grid-cols-1 gap-6 md:grid-cols-2">
        <LumpingColumn title="Coarsest strong lumping" source="equal row sums into each block" labels={labels} partition={strong.partition} lumped={format(strong.lumped)} />
        <LumpingColumn title="Coarsest exact lumping" source="equal column sums from each block" labels={labels} partition={exact.partition} lumped={format(exact.lumped)} />
      </div>
      <form action={`${path}#lumpings`} className="flex flex-wrap items-center gap-x-3 gap-y-1 border-t border-line pt-3 text-sm">
        <span className="text-ink-faint">Keep apart:</span>
        {labels.map((label, i) => (
          <label key={i} className="flex items-center gap-1">
            <input type="checkbox" name="keep" value={i} defaultChecked={keep.includes(i)} className="accent-tide-700" />
            {label}
          </label>
        ))}
        <button type="submit" className="rounded-md px-3 py-1 font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50">
          Lump again
        </button>
        {keep.length > 0 ? (
          <Link href={`${path}#lumpings`} className="text-xs text-ink-faint underline-offset-2 hover:underline">
            clear
          </Link>
        ) : null}
      </form>
    </div>
  );
}
