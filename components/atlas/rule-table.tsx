import { cellPalette, cssColour } from "@/components/spacetime/palette";
import { totalisticCode } from "@/lib/ca";

/** Neighbourhood index as base-k digits, x_{-r} the most significant (DOMAIN.md §1). */
function digits(index: number, k: number, width: number): string {
  return index.toString(k).padStart(width, "0");
}

const PER_ROW = 16;
const SHOWN = 256;

/** Text on a coloured cell: light on the dark half of the palette. */
function Output({ value, k }: { value: number; k: number }) {
  const palette = cellPalette(k);
  const c = palette[value] ?? palette[palette.length - 1];
  const dark = 0.299 * c[0] + 0.587 * c[1] + 0.114 * c[2] < 140;
  return (
    <span className={`flex h-6 items-center justify-center rounded-sm font-semibold ${dark ? "text-paper-raised" : "text-ink"}`} style={{ backgroundColor: cssColour(c) }}>
      {value.toString(36)}
    </span>
  );
}

function neighbourhoodHeading(r: number): string {
  const sub = (i: number) => (i < 0 ? `₋${"₀₁₂₃₄₅₆₇₈₉"[-i]}` : "₀₁₂₃₄₅₆₇₈₉"[i]);
  return Array.from({ length: 2 * r + 1 }, (_, j) => `x${sub(j - r)}`).join(" ");
}

/**
 * A 1-D CA rule (an ECA is k = 2, r = 1) as a compact two-row table: each neighbourhood written as
 * its digits x_{-r} … x_r, in index order 0 → k^(2r+1) − 1, with the new centre cell beneath it in
 * the house colours. Long tables wrap every 16 neighbourhoods; very long ones become a digit string.
 */
export function RuleTable({ k, r, table, rule }: { k: number; r: number; table: number[]; rule?: number }) {
  const width = 2 * r + 1;
  const chunks: number[][] = [];
  for (let i = 0; i < table.length; i += PER_ROW) chunks.push(Array.from({ length: Math.min(PER_ROW, table.length - i) }, (_, j) => i + j));
  return (
    <figure className="min-w-0">
      <figcaption className="mb-2 text-sm">
        {rule !== undefined ? (
          <>
            <span className="font-semibold">Rule {rule}</span>{" "}
            <span className="text-ink-faint">
              — the outputs below, read from 111 down to 000, are {rule} in binary: <span className="font-mono">{rule.toString(2).padStart(8, "0")}</span>
            </span>
          </>
        ) : (
          <>
            <span className="font-semibold">
              {k} symbols, radius {r}
            </span>{" "}
            <span className="text-ink-faint">({table.length} neighbourhoods of {width} cells)</span>
          </>
        )}
      </figcaption>
      {table.length <= SHOWN ? (
        <div className="space-y-2 overflow-x-auto">
          {chunks.map((chunk) => (
            <table key={chunk[0]} className="border-separate border-spacing-x-0.5 font-mono text-xs">
              <tbody>
                <tr>
                  <th scope="row" className="whitespace-nowrap pr-2 text-left font-sans font-normal text-ink-faint">
                    {neighbourhoodHeading(r)}
                  </th>
                  {chunk.map((i) => (
                    <td key={i} className="min-w-8 rounded-sm bg-paper px-1 py-0.5 text-center tracking-wider text-ink-soft">
                      {digits(i, k, width)}
                    </td>
                  ))}
                </tr>
                <tr>
                  <th scope="row" className="whitespace-nowrap pr-2 text-left font-sans font-normal text-ink-faint">
                    new x₀
                  </th>
                  {chunk.map((i) => (
                    <td key={i} title={`neighbourhood ${digits(i, k, width)} → ${table[i]}`}>
                      <Output value={table[i]} k={k} />
                    </td>
                  ))}
                </tr>
              </tbody>
            </table>
          ))}
        </div>
      ) : (
        <>
          <p className="mb-1 text-xs text-ink-faint">New centre cell for each neighbourhood in index order 0 → {table.length - 1}:</p>
          <p className="max-h-40 overflow-auto break-all rounded bg-paper p-2 font-mono text-xs leading-relaxed">{table.join(k > 10 ? "," : "")}</p>
        </>
      )}
    </figure>
  );
}

/** An elementary CA by its Wolfram code: bit 4a + 2b + c is the new centre for (a, b, c) (Wolfram, Rev. Mod. Phys. 55, 601, 1983). */
export function EcaRuleTable({ rule }: { rule: number }) {
  return <RuleTable k={2} r={1} rule={rule} table={Array.from({ length: 8 }, (_, i) => (rule >> i) & 1)} />;
}

/** A three-state radius-1 rule that depends only on the sum of its three cells is named by its totalistic code (DOMAIN.md §2b). */
function TotalisticNote({ code }: { code: number }) {
  return (
    <p className="mt-3 text-sm">
      <span className="font-semibold">Totalistic, code {code}</span>{" "}
      <span className="text-ink-faint">
        — the new cell depends only on the sum s = x₋₁ + x₀ + x₁ (0 to 6), and is base-3 digit s of the code (digit 0 last):{" "}
        <span className="font-mono">{code.toString(3).padStart(7, "0")}</span> read from s = 6 down to s = 0.
      </span>
    </p>
  );
}

export function CaRuleTable({ k, r, table }: { k: number; r: number; table: number[] }) {
  const code = totalisticCode({ k, r, table });
  return (
    <>
      <RuleTable k={k} r={r} table={table} />
      {code !== null ? <TotalisticNote code={code} /> : null}
    </>
  );
}
