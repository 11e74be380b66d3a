import { approximate, blockOrder } from "./heatMapLayout";

/**
 * A transition matrix as a heat map: darker tide for larger probabilities, the exact entry on hover
 * and in the cell. With a partition, states are grouped by block and the blocks outlined, so a
 * strong lumping shows as equal row sums inside each outlined rectangle.
 */
export function HeatMap({ labels, matrix, partition = null, caption }: { labels: string[]; matrix: string[][]; partition?: number[] | null; caption: string }) {
  const { order, ends } = blockOrder(partition, matrix.length);
  const edge = (i: number) => (ends.has(i) ? "2px solid var(--color-saffron-600)" : undefined);
  return (
    <figure className="min-w-0">
      <figcaption className="mb-2 text-xs text-ink-faint">{caption}</figcaption>
      <div className="overflow-x-auto">
        <table className="border-collapse text-[11px]">
          <thead>
            <tr>
              <th />
              {order.map((j) => (
                <th key={j} scope="col" className="max-w-16 truncate px-1 pb-1 font-sans text-[11px] font-normal text-ink-faint" title={labels[j]}>
                  {labels[j]}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {order.map((i, row) => (
              <tr key={i}>
                <th scope="row" className="max-w-24 truncate pr-2 text-right font-sans text-[11px] font-normal text-ink-faint" title={labels[i]}>
                  {labels[i]}
                </th>
                {order.map((j, col) => {
                  const p = approximate(matrix[i][j]);
                  return (
                    <td
                      key={j}
                      title={`${labels[i]} → ${labels[j]}: ${matrix[i][j]}`}
                      className={`h-9 min-w-9 text-center font-mono ${p > 0.45 ? "text-paper-raised" : "text-ink-soft"}`}
                      style={{
                        backgroundColor: `color-mix(in oklab, var(--color-tide-700) ${Math.round(p * 100)}%, var(--color-paper-raised))`,
                        borderRight: edge(col),
                        borderBottom: edge(row),
                      }}
                    >
                      {matrix[i][j] === "0" ? "" : matrix[i][j]}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </figure>
  );
}
