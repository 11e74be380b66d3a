import type { CanonicalView } from "./canonicalView";
import { MatrixTable } from "./matrix-table";
import { CaRuleTable, EcaRuleTable } from "./rule-table";

/** A model's canonical form drawn for reading: the exact matrix of a chain, the rule of a CA. */
export function CanonicalModel({ view }: { view: CanonicalView }) {
  switch (view.type) {
    case "markov":
      return <MatrixTable labels={view.labels} matrix={view.matrix} caption="Transition matrix P, exact (row = from, column = to)" />;
    case "eca":
      return <EcaRuleTable rule={view.rule} />;
    case "ca":
      return <CaRuleTable k={view.k} r={view.r} table={view.table} />;
    case "derived":
      return (
        <div className="space-y-3">
          <p className="text-sm text-ink-soft">
            Derived model: <span className="font-mono">{view.kind}</span>
            {view.block !== null ? <> with block size N = {view.block}</> : null}
            {view.steps !== null ? <>, T = {view.steps} steps</> : null}, built on:
          </p>
          <div className="border-l-2 border-line pl-4">
            <CanonicalModel view={view.base} />
          </div>
        </div>
      );
    case "unknown":
      return <p className="text-sm text-ink-faint">This model&apos;s canonical form has no drawing; see the JSON below.</p>;
  }
}
