function Cell({ on }: { on: boolean }) {
  return <span className={`inline-block h-3 w-3 border border-ink-soft ${on ? "bg-ink" : "bg-paper-raised"}`} />;
}

/**
 * An elementary CA rule: its Wolfram number, binary digits and the eight neighbourhoods with the
 * new centre cell, where neighbourhood (a, b, c) reads bit 4a + 2b + c (Wolfram, Rev. Mod. Phys. 55,
 * 601, 1983).
 */
export function EcaRuleTable({ rule }: { rule: number }) {
  const neighbourhoods = [7, 6, 5, 4, 3, 2, 1, 0];
  return (
    <figure className="inline-block">
      <figcaption className="mb-2 text-sm">
        <span className="font-semibold">Rule {rule}</span>{" "}
        <span className="font-mono text-ink-faint">= {rule.toString(2).padStart(8, "0")}₂</span>
      </figcaption>
      <table className="border-collapse text-center">
        <tbody>
          <tr>
            {neighbourhoods.map((n) => (
              <td key={n} className="px-1.5 pb-1" title={`neighbourhood ${n.toString(2).padStart(3, "0")}`}>
                <span className="inline-flex gap-px">
                  {[4, 2, 1].map((bit) => (
                    <Cell key={bit} on={(n & bit) !== 0} />
                  ))}
                </span>
              </td>
            ))}
          </tr>
          <tr>
            {neighbourhoods.map((n) => (
              <td key={n} className="px-1.5">
                <Cell on={((rule >> n) & 1) === 1} />
              </td>
            ))}
          </tr>
          <tr>
            {neighbourhoods.map((n) => (
              <td key={n} className="px-1.5 font-mono text-xs text-ink-faint">
                {(rule >> n) & 1}
              </td>
            ))}
          </tr>
        </tbody>
      </table>
    </figure>
  );
}

/** Neighbourhood index as base-k digits, x_{-r} the most significant (DOMAIN §1). */
function digits(index: number, k: number, width: number): string {
  return index.toString(k).padStart(width, "0");
}

const SHOWN = 64;

/**
 * A general 1-D CA rule table (alphabet k, radius r). Small tables are listed neighbourhood by
 * neighbourhood; large ones as the digit string of the table in index order.
 */
export function CaRuleTable({ k, r, table }: { k: number; r: number; table: number[] }) {
  const width = 2 * r + 1;
  return (
    <figure>
      <figcaption className="mb-2 text-sm">
        <span className="font-semibold">
          k = {k}, r = {r}
        </span>{" "}
        <span className="text-ink-faint">
          ({table.length} neighbourhoods, x<sub>−r</sub> most significant)
        </span>
      </figcaption>
      {table.length <= SHOWN && k <= 10 ? (
        <dl className="grid grid-cols-[repeat(auto-fill,minmax(6.5rem,1fr))] gap-x-4 gap-y-0.5 font-mono text-xs">
          {table.map((value, i) => (
            <div key={i} className="flex justify-between border-b border-line">
              <dt className="text-ink-faint">{digits(i, k, width)}</dt>
              <dd className="font-semibold text-ink">{value}</dd>
            </div>
          ))}
        </dl>
      ) : (
        <p className="max-h-40 overflow-auto break-all rounded bg-paper p-2 font-mono text-xs leading-relaxed">
          {table.join(k > 10 ? "," : "")}
        </p>
      )}
    </figure>
  );
}
