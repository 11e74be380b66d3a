/** A fraction "p/q" set as a small stacked fraction; integers stay as they are. */
function Fraction({ value }: { value: string }) {
  const [num, den] = value.split("/");
  if (!den) return <span className={value === "0" ? "text-ink-faint" : undefined}>{value}</span>;
  return (
    <span className="inline-flex flex-col items-center align-middle leading-none">
      <span className="px-0.5">{num}</span>
      <span className="w-full border-t border-current px-0.5 pt-px">{den}</span>
    </span>
  );
}

/**
 * A transition matrix with exact entries as they are stored ("p/q" strings), rows and columns
 * labelled by the chain's states; row i, column j is the probability of moving from i to j.
 */
export function MatrixTable({ labels, matrix, caption }: { labels: string[]; matrix: string[][]; caption?: string }) {
  return (
    <div className="overflow-x-auto">
      <table className="border-collapse font-mono text-sm">
        {caption ? <caption className="mb-1 text-left font-sans text-xs text-ink-faint">{caption}</caption> : null}
        <thead>
          <tr>
            <th scope="col" className="px-2 py-1 text-xs font-normal text-ink-faint">
              from \ to
            </th>
            {labels.map((label, j) => (
              <th key={j} scope="col" className="border-b border-line-strong px-3 py-1 text-xs font-medium text-ink-faint">
                {label}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {matrix.map((row, i) => (
            <tr key={i}>
              <th scope="row" className="border-r border-line-strong px-2 py-1 text-right text-xs font-medium text-ink-faint">
                {labels[i] ?? i}
              </th>
              {row.map((entry, j) => (
                <td key={j} className="px-3 py-1.5 text-center tabular-nums text-ink">
                  <Fraction value={entry} />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
