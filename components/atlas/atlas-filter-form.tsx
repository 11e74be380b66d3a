import type { AtlasFilters, FilterProblem } from "./atlasFilters";

const input = "w-full rounded border border-line-strong bg-paper-raised px-2 py-1 text-sm focus:border-tide-600 focus:outline-none";

function Field({
  name,
  label,
  problems,
  children,
}: {
  name: keyof AtlasFilters;
  label: string;
  problems: FilterProblem[];
  children: React.ReactNode;
}) {
  const problem = problems.find((p) => p.field === name);
  return (
    <div className="flex min-w-0 flex-col gap-0.5">
      <label htmlFor={`filter-${name}`} className="text-xs font-medium text-ink-faint">
        {label}
      </label>
      {children}
      {problem ? (
        <p id={`filter-${name}-error`} className="text-xs text-brick-700" aria-live="polite">
          {label} {problem.message}
        </p>
      ) : null}
    </div>
  );
}

/**
 * The atlas filters as a plain GET form: the filters live in the URL, so a search can be
 * bookmarked, shared and reloaded, and the form works without client JavaScript.
 */
export function AtlasFilterForm({
  filters,
  problems,
  mapKinds,
  modelKinds,
}: {
  filters: AtlasFilters;
  problems: FilterProblem[];
  mapKinds: readonly string[];
  modelKinds: readonly string[];
}) {
  const described = (name: keyof AtlasFilters) =>
    problems.some((p) => p.field === name) ? { "aria-describedby": `filter-${name}-error`, "aria-invalid": true } : {};
  return (
    <form method="get" action="/atlas" role="search" className="grid grid-cols-2 gap-3 rounded-lg border border-line bg-paper-raised p-3 sm:grid-cols-4 lg:grid-cols-8">
      <div className="col-span-2">
        <Field name="q" label="Name" problems={problems}>
          <input id="filter-q" name="q" defaultValue={filters.q} placeholder="e.g. ECA 146, weather" className={input} {...described("q")} />
        </Field>
      </div>
      <Field name="rule" label="Rule" problems={problems}>
        <input id="filter-rule" name="rule" inputMode="numeric" defaultValue={filters.rule} placeholder="0–255" className={input} {...described("rule")} />
      </Field>
      <Field name="class" label="Symmetry class" problems={problems}>
        <input id="filter-class" name="class" inputMode="numeric" defaultValue={filters.class} placeholder="min rule" className={input} {...described("class")} />
      </Field>
      <Field name="tag" label="Tag" problems={problems}>
        <input id="filter-tag" name="tag" defaultValue={filters.tag} className={input} {...described("tag")} />
      </Field>
      <Field name="block" label="Block size" problems={problems}>
        <input id="filter-block" name="block" inputMode="numeric" defaultValue={filters.block} placeholder="N" className={input} {...described("block")} />
      </Field>
      <Field name="mapKind" label="Map kind" problems={problems}>
        <select id="filter-mapKind" name="mapKind" defaultValue={filters.mapKind ?? ""} className={input} {...described("mapKind")}>
          <option value="">any</option>
          {mapKinds.map((k) => (
            <option key={k} value={k}>
              {k}
            </option>
          ))}
        </select>
      </Field>
      <Field name="kind" label="Model class" problems={problems}>
        <select id="filter-kind" name="kind" defaultValue={filters.kind ?? ""} className={input} {...described("kind")}>
          <option value="">any</option>
          {modelKinds.map((k) => (
            <option key={k} value={k}>
              {k}
            </option>
          ))}
        </select>
      </Field>
      {filters.constant ? <input type="hidden" name="constant" value={filters.constant} /> : null}
      {problems
        .filter((p) => p.field === "view" || p.field === "constant")
        .map((p) => (
          <p key={p.field} className="col-span-2 text-xs text-brick-700 sm:col-span-4 lg:col-span-8" role="alert">
            The link&apos;s “{p.field}” {p.message}; it was left out.
          </p>
        ))}
      <div className="col-span-2 flex items-end gap-2 sm:col-span-4 lg:col-span-8">
        <button type="submit" className="rounded bg-tide-700 px-3 py-1 text-sm font-medium text-paper-raised hover:bg-tide-800">
          Search
        </button>
        <a href="/atlas" className="px-2 py-1 text-sm text-ink-faint underline-offset-2 hover:underline">
          Clear filters
        </a>
      </div>
    </form>
  );
}
