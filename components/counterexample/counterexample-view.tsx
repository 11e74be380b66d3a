import type { RuleTable } from "@/lib/ca";
import { asCounterexample, describeCounterexample, type KnownCounterexample, type Witness } from "./describeCounterexample";
import { windowEvolution } from "./spaceTimeRows";

const CELL = 14;
const COMPACT_CELL = 9;

type Props = {
  counterexample: unknown;
  /** The fine rule, to draw the window's evolution; without it the window and its image are drawn. */
  rule?: { k: number; r: number; table: ArrayLike<number> } | null;
  steps?: number;
  labels?: string[];
  /** A compact drawing for the canvas. @default false */
  compact?: boolean;
};

/**
 * A failed check drawn and said: the fine window as cells and its evolution, the blockwise projection,
 * and the disagreeing coarse values with the offending cell marked; for a lumping the two states,
 * the target block and both exact sums; for a matrix the entry that differs.
 */
export function CounterexampleView({ counterexample, rule, steps, labels, compact = false }: Props) {
  const c = asCounterexample(counterexample);
  if (!c) return null;
  const sentence = describeCounterexample(c, { steps, labels });
  return (
    <figure className={`space-y-2 rounded-md border border-brick-600/40 bg-brick-50 ${compact ? "p-1" : "p-2"}`} data-counterexample={c.kind}>
      <Drawing c={c} rule={rule} steps={steps} labels={labels} compact={compact} />
      <figcaption className={`${compact ? "text-[10px] leading-snug" : "text-xs"} text-brick-700`} data-counterexample-text>
        {sentence}
      </figcaption>
    </figure>
  );
}

function Drawing({ c, rule, steps, labels, compact }: { c: KnownCounterexample } & Omit<Props, "counterexample">) {
  const table: RuleTable | null = rule ? { k: rule.k, r: rule.r, table: Uint8Array.from(rule.table) } : null;
  switch (c.kind) {
    case "not-a-function":
      return (
        <div className={`flex gap-4 ${compact ? "" : "flex-wrap"}`} aria-hidden>
          <WindowDrawing w={c.first} other={c.second} rule={table} steps={steps} title="first window" compact={compact} />
          <WindowDrawing w={c.second} other={c.first} rule={table} steps={steps} title="second window" compact={compact} />
        </div>
      );
    case "coarse-rule-mismatch":
      return (
        <div aria-hidden>
          <WindowDrawing w={c} rule={table} steps={steps} title="fine window" compact={compact} claimed={c.claimed} />
        </div>
      );
    case "not-lumpable":
      return (
        <table className="text-xs" aria-hidden>
          <thead>
            <tr className="text-ink-faint">
              <th className="pr-3 text-left font-normal">state (block {c.block + 1})</th>
              <th className="text-left font-normal">into block {c.targetBlock + 1}</th>
            </tr>
          </thead>
          <tbody className="font-mono">
            {c.states.map((s, i) => (
              <tr key={s}>
                <td className="pr-3">{labels?.[s] ?? `state ${s + 1}`}</td>
                <td className="font-semibold text-brick-700">{c.sums[i]}</td>
              </tr>
            ))}
          </tbody>
        </table>
      );
    case "matrix-entry-mismatch":
    case "lumped-entry-mismatch":
    case "table-entry-mismatch":
      return (
        <p className="font-mono text-xs" aria-hidden>
          claimed <span className="font-semibold text-brick-700">{String(c.claimed)}</span> ≠ computed{" "}
          <span className="font-semibold text-moss-700">{String(c.actual)}</span>
        </p>
      );
    case "not-exactly-lumpable":
    case "label-mismatch":
    case "target-mismatch":
      return null;
  }
}

function Cells({ cells, indent = 0, mark, differ, size = CELL }: { cells: number[]; indent?: number; mark?: { from: number; to: number }; differ?: Set<number>; size?: number }) {
  const CELL = size;
  return (
    <svg width={(indent + cells.length) * CELL} height={CELL} className="block">
      {cells.map((v, i) => {
        const marked = mark && i >= mark.from && i < mark.to;
        return (
          <rect
            key={i}
            x={(indent + i) * CELL + 0.5}
            y={0.5}
            width={CELL - 1}
            height={CELL - 1}
            className={`${v === 0 ? "fill-paper-raised" : v === 1 ? "fill-ink" : "fill-tide-500"} ${marked ? "stroke-brick-600" : differ?.has(i) ? "stroke-saffron-500" : "stroke-line-strong"}`}
            strokeWidth={marked || differ?.has(i) ? 2 : 1}
          />
        );
      })}
    </svg>
  );
}

/** One fine window: cells, evolution (when the rule is known), blockwise projection, coarse value. */
function WindowDrawing({
  w,
  other,
  rule,
  steps,
  title,
  compact,
  claimed,
}: {
  w: Witness;
  other?: Witness;
  rule: RuleTable | null;
  steps?: number;
  title: string;
  compact?: boolean;
  claimed?: number;
}) {
  const N = w.imageCells.length;
  const CELL = compact ? COMPACT_CELL : 14;
  const fine = w.cells.join("").split("").map((ch) => parseInt(ch, 36));
  const otherFine = other?.cells.join("").split("").map((ch) => parseInt(ch, 36));
  const differ = new Set(otherFine ? fine.flatMap((v, i) => (v !== otherFine[i] ? [i] : [])) : []);
  const evolution = rule && steps ? windowEvolution(w, rule, steps) : null;
  return (
    <div className="space-y-1">
      <p className="text-[11px] font-medium text-ink-soft">{title}</p>
      {evolution ? (
        evolution.rows.map((row, i) => (
          <Cells
            key={i}
            cells={row.cells}
            indent={row.indent}
            differ={i === 0 ? differ : undefined}
            mark={i === evolution.rows.length - 1 ? evolution.centre : undefined}
            size={CELL}
          />
        ))
      ) : (
        <>
          <Cells cells={fine} differ={differ} size={CELL} />
          {compact ? null : <p className="text-[11px] text-ink-faint">centre block after the steps:</p>}
          <Cells cells={w.imageCells.split("").map((ch) => parseInt(ch, 36))} indent={((w.window.length - 1) / 2) * N} mark={{ from: 0, to: N }} size={CELL} />
        </>
      )}
      <p className="text-[11px] text-ink-faint">projected block by block:</p>
      <svg width={w.coarseWindow.length * N * CELL} height={CELL} className="block">
        {w.coarseWindow.map((v, i) => (
          <g key={i}>
            <rect x={i * N * CELL + 0.5} y={0.5} width={N * CELL - 1} height={CELL - 1} className="fill-tide-50 stroke-tide-600" />
            <text x={i * N * CELL + (N * CELL) / 2} y={CELL - 3} textAnchor="middle" className="fill-tide-800 font-mono text-[10px]">
              {v}
            </text>
          </g>
        ))}
      </svg>
      <p className="font-mono text-xs">
        {compact ? "" : "coarse value "}
        <span className="rounded bg-brick-100 px-1 font-semibold text-brick-700 ring-2 ring-brick-600">{w.coarse}</span>
        {claimed !== undefined ? (
          <>
            {" "}
            ≠ coarse rule <span className="rounded bg-moss-50 px-1 font-semibold text-moss-700">{claimed}</span>
          </>
        ) : null}
      </p>
    </div>
  );
}
