import { formatRational, parseRational } from "@/lib/rational";
import { stationaryDistributions } from "@/lib/markov";
import { approximate } from "./heatMapLayout";

const named = (states: number[], labels: string[]) => `{${states.map((s) => labels[s] ?? String(s)).join(", ")}}`;

/**
 * The chain's stationary distributions, exact: one per closed communicating class, each class
 * named by its states' labels; transient states are named too.
 */
export function StationaryView({ labels, matrix }: { labels: string[]; matrix: string[][] }) {
  let result: ReturnType<typeof stationaryDistributions>;
  try {
    result = stationaryDistributions(matrix.map((row) => row.map(parseRational)));
  } catch {
    return <p className="text-sm text-ink-faint">This matrix could not be read as exact rationals.</p>;
  }
  const { closed, transient } = result;
  return (
    <div className="space-y-4">
      <p className="text-sm text-ink-soft">
        {closed.length === 1 && transient.length === 0
          ? "Every state reaches every other, so the chain has one closed class and exactly one stationary distribution π (π P = π, entries summing to 1)."
          : `The chain has ${closed.length} closed class${closed.length === 1 ? "" : "es"} (sets of states it never leaves once inside); each has one stationary distribution, and every stationary distribution is a mixture of these.`}
        {transient.length > 0 ? <> Transient states (left for good, so π is 0 there): {named(transient, labels)}.</> : null}
      </p>
      {closed.map((c, k) => (
        <figure key={k} className="min-w-0">
          <figcaption className="mb-1 text-sm font-medium">
            {closed.length > 1 ? `Closed class ${k + 1}: ` : "Closed class: "}
            <span className="font-normal">{named(c.states, labels)}</span>
          </figcaption>
          <table className="border-collapse text-sm">
            <tbody>
              {c.states.map((s) => {
                const value = formatRational(c.distribution[s]);
                return (
                  <tr key={s}>
                    <th scope="row" className="py-0.5 pr-3 text-left text-xs font-normal text-ink-faint">
                      π({labels[s] ?? s})
                    </th>
                    <td className="py-0.5 pr-3 font-mono tabular-nums">{value}</td>
                    <td className="w-40 py-0.5" aria-hidden>
                      <span className="block h-2 rounded-sm bg-tide-600" style={{ width: `${Math.max(2, approximate(value) * 100)}%` }} />
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </figure>
      ))}
    </div>
  );
}
