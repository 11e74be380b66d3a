import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { Suspense } from "react";
import { CanonicalModel } from "@/components/atlas/canonical-model";
import { canonicalView, prettyJson } from "@/components/atlas/canonicalView";
import { CopyBlock } from "@/components/atlas/copy-block";
import { DownloadJson } from "@/components/atlas/download-link";
import { MapTable, type MapRow } from "@/components/atlas/map-table";
import { parseTags } from "@/components/atlas/model-table";
import { PageHeader } from "@/components/atlas/page-header";
import { Skeleton } from "@/components/atlas/skeleton";
import { SpaceTimeExplorer } from "@/components/spacetime/space-time-explorer";
import { ruleViewOf } from "@/components/spacetime/ruleViews";
import { CompositeEdges } from "@/app/chains/composite-edges";
import { Panel } from "@/components/ui/panel";
import { WatchButton } from "@/components/watch-button";
import { getModel, listSearchRecords, type MapKind } from "@/db/queries/atlas";
import { listModelMaps, type ModelMapRow } from "@/db/queries/maps";
import { MAP_KINDS } from "@/db/schema";
import { modelMapsHref, parseModelMapFilters, type ListSide, type ModelMapFilters } from "@/components/atlas/modelMapFilters";
import { can } from "@/lib/policy";
import { ModelAnnotations } from "@/components/team/model-annotations";
import { getWorkspaceContext } from "@/server/context";
import { ModelDetailsForm } from "@/components/atlas/model-details-form";
import { findLumpingAction, updateModelDetailsAction } from "./actions";
import { HeatMap } from "@/components/atlas/heat-map";
import { formatDate } from "@/components/atlas/formatDate";
import { LumpRequestForm } from "@/components/atlas/lump-request-form";
import { StationaryView } from "@/components/atlas/stationary-view";
import { searchKindWords } from "@/components/atlas/searchKindWords";
import { LumpingComparison } from "@/components/atlas/lumping-comparison";
import { parseKeepApart } from "@/components/atlas/lumpingComparison";

type Props = { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const [{ id }, { workspace }] = await Promise.all([params, getWorkspaceContext()]);
  const model = await getModel({ workspaceId: workspace.id, idOrAddress: decodeURIComponent(id) });
  return { title: model?.name ?? "Model" };
}

function rowsOf(items: ModelMapRow[], end: "source" | "target"): MapRow[] {
  return items.map((m) => ({
    id: m.id,
    kind: m.kind,
    block: m.block,
    steps: m.steps,
    summary: m.summary,
    status: m.status,
    derivation: m.derivation,
    definition: m.definition,
    other: { id: m[end].id, name: m[end].name },
  }));
}

const PAGE = 20;

function isCursor(text: string): boolean {
  try {
    const key: unknown = JSON.parse(Buffer.from(text, "base64url").toString("utf8"));
    return Array.isArray(key) && key.length === 3;
  } catch {
    return false;
  }
}

async function MapList({ workspaceId, model, side, filters, labels }: { workspaceId: string; model: { id: string; rule: number | null }; side: ListSide; filters: ModelMapFilters; labels?: string[] }) {
  const f = filters[side];
  const direction = side === "o" ? "from" : "to";
  // Nearly every rule coarse-grains onto the constant rules 0 and 255: one line for them unless asked.
  const hideConstant = side === "o" && !f.constants;
  const list = await listModelMaps({
    workspaceId,
    // A cursor this server did not give out is dropped: the list starts again at its first page.
    cursor: f.cursor && isCursor(f.cursor) ? f.cursor : undefined,
    modelId: model.id,
    direction,
    kind: f.kind as MapKind | undefined,
    block: f.block,
    otherClass: f.cls,
    hideConstant,
    limit: PAGE,
  });
  const path = `/atlas/models/${model.id}`;
  const title = side === "o" ? "Coarse-grains onto" : "Coarse-grained from";
  const filtered = f.kind || f.block !== undefined || f.cls !== undefined;
  return (
    <Panel title={`${title} (${list.total})`}>
      <div id={`maps-${side}`} className="space-y-3">
        <MapListFilters path={path} side={side} filters={filters} classes={model.rule !== null} />
        {hideConstant && list.constant > 0 ? (
          <p className="rounded-md bg-paper px-3 py-2 text-sm text-ink-soft">
            onto the constant rules (ECA 0, ECA 255): {list.constant} map{list.constant === 1 ? "" : "s"}{" "}
            <Link href={modelMapsHref(path, filters, side, { ...f, constants: true, cursor: undefined })} className="text-tide-700 underline-offset-2 hover:underline">
              show them
            </Link>
          </p>
        ) : null}
        <MapTable
          rows={rowsOf(list.items, side === "o" ? "target" : "source")}
          labels={side === "o" ? labels : undefined}
          otherHeading={side === "o" ? "Target" : "Source"}
          empty={
            filtered
              ? "No map matches these filters; clear them to see every map."
              : list.constant > 0
                ? "Every map from this model goes onto a constant rule (folded above)."
              : side === "o"
                ? "No certified map starts at this model yet. Ask what it coarse-grains onto to start a search."
                : "No certified map ends at this model yet."
          }
        />
        {side === "o" && f.constants && list.constant > 0 ? (
          <Link href={modelMapsHref(path, filters, side, { ...f, constants: false, cursor: undefined })} className="text-xs text-tide-700 underline-offset-2 hover:underline">
            Fold the maps onto constant rules into one line
          </Link>
        ) : null}
        {f.cursor || list.nextCursor ? (
          <nav aria-label={`${title}: pages`} className="flex items-center justify-between border-t border-line pt-3 text-sm">
            {f.cursor ? (
              <Link href={modelMapsHref(path, filters, side, { ...f, cursor: undefined })} className="text-ink-soft underline-offset-2 hover:underline">
                ← First page
              </Link>
            ) : (
              <span />
            )}
            {list.nextCursor ? (
              <Link href={modelMapsHref(path, filters, side, { ...f, cursor: list.nextCursor })} className="font-medium text-ink underline-offset-2 hover:underline">
                Next {PAGE} →
              </Link>
            ) : null}
          </nav>
        ) : null}
      </div>
    </Panel>
  );
}

function MapListFilters({ path, side, filters, classes }: { path: string; side: ListSide; filters: ModelMapFilters; classes: boolean }) {
  const f = filters[side];
  const other = side === "o" ? "f" : "o";
  const keep = filters[other];
  const select = "rounded-md border border-line-strong bg-paper-raised px-2 py-1 text-sm";
  return (
    <form action={`${path}#maps-${side}`} className="flex flex-wrap items-end gap-2 text-sm">
      {keep.kind ? <input type="hidden" name={`${other}kind`} value={keep.kind} /> : null}
      {keep.block !== undefined ? <input type="hidden" name={`${other}block`} value={keep.block} /> : null}
      {keep.cls !== undefined ? <input type="hidden" name={`${other}class`} value={keep.cls} /> : null}
      {keep.constants ? <input type="hidden" name={`${other}const`} value="1" /> : null}
      {f.constants ? <input type="hidden" name={`${side}const`} value="1" /> : null}
      <label className="flex flex-col gap-0.5 text-xs text-ink-faint">
        Kind
        <select name={`${side}kind`} defaultValue={f.kind ?? ""} className={select}>
          <option value="">any</option>
          {MAP_KINDS.map((k) => (
            <option key={k} value={k}>
              {k}
            </option>
          ))}
        </select>
      </label>
      <label className="flex flex-col gap-0.5 text-xs text-ink-faint">
        Block size N
        <input name={`${side}block`} defaultValue={f.block ?? ""} inputMode="numeric" className={`${select} w-20`} />
      </label>
      {classes ? (
        <label className="flex flex-col gap-0.5 text-xs text-ink-faint" title="Rules equivalent under left–right reflection and 0↔1 exchange, named by the smallest rule">
          {side === "o" ? "Target" : "Source"} symmetry class
          <input name={`${side}class`} defaultValue={f.cls ?? ""} inputMode="numeric" className={`${select} w-24`} />
        </label>
      ) : null}
      <button type="submit" className="rounded-md px-3 py-1 font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50">
        Filter
      </button>
      {f.kind || f.block !== undefined || f.cls !== undefined ? (
        <Link href={modelMapsHref(path, filters, side, { constants: f.constants })} className="px-1 py-1 text-xs text-ink-faint underline-offset-2 hover:underline">
          clear
        </Link>
      ) : null}
    </form>
  );
}

function Edges({ workspaceId, model, filters, labels }: { workspaceId: string; model: { id: string; rule: number | null }; filters: ModelMapFilters; labels?: string[] }) {
  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      {/* Rendered with the page (its loading.tsx shows the skeleton): two indexed queries, and the counts in the titles stay in step with the page. */}
      <MapList workspaceId={workspaceId} model={model} side="o" filters={filters} labels={labels} />
      <MapList workspaceId={workspaceId} model={model} side="f" filters={filters} />
    </div>
  );
}

async function Searches({ workspaceId, modelId }: { workspaceId: string; modelId: string }) {
  const records = await listSearchRecords({ workspaceId, modelId });
  if (records.length === 0) {
    return <p className="text-sm text-ink-faint">No exhaustive search from this model has been recorded.</p>;
  }
  return (
    <ul className="divide-y divide-line text-sm">
      {records.map((r) => (
        <li key={r.id} className="flex flex-wrap items-baseline gap-x-3 gap-y-1 py-2">
          <span className="text-xs font-medium text-ink-soft" title={r.kind}>
            {searchKindWords(r.kind)}
          </span>
          <span>{r.maxBlock !== null ? <>block sizes up to N = {r.maxBlock}</> : "no block bound"}</span>
          <span className="text-ink-soft">
            {r.found} target{r.found === 1 ? "" : "s"} found
          </span>
          <span className="ml-auto text-xs text-ink-faint">{formatDate(r.createdAt)}</span>
          <details className="w-full text-xs text-ink-faint">
            <summary className="cursor-pointer">How it searched</summary>
            <p className="mt-1">
              {r.algorithm} <span className="font-mono">({r.algorithmVersion})</span>
            </p>
          </details>
        </li>
      ))}
    </ul>
  );
}

export default async function ModelPage({ params, searchParams }: Props) {
  const [{ id }, { workspace, role }, query] = await Promise.all([params, getWorkspaceContext(), searchParams]);
  const filters = parseModelMapFilters(query, MAP_KINDS);
  const model = await getModel({ workspaceId: workspace.id, idOrAddress: decodeURIComponent(id) });
  if (!model) notFound();
  const base = model.baseModelId ? await getModel({ workspaceId: workspace.id, idOrAddress: model.baseModelId }) : null;
  const tags = parseTags(model.tags);
  const pretty = prettyJson(model.canonical);
  const view = canonicalView(model.canonical);
  const rule = ruleViewOf(view);

  const facts: [string, React.ReactNode][] = [
    ["Content address", <span key="a" className="break-all font-mono text-xs">{model.address}</span>],
    ["Class", <span key="k" className="font-mono">{model.kind}</span>],
  ];
  if (model.rule !== null) facts.push(["Rule", <span key="r" className="font-mono">{model.rule}</span>]);
  if (model.symmetryClass !== null)
    facts.push([
      "Symmetry class",
      <span key="c">
        <Link href={`/atlas?class=${model.symmetryClass}`} className="font-mono text-tide-800 underline-offset-2 hover:underline">
          {model.symmetryClass}
        </Link>{" "}
        <span className="text-xs text-ink-faint">— the rules equal to this one up to left–right reflection and 0↔1 exchange, named by the smallest</span>
      </span>,
    ]);
  if (model.states !== null) facts.push(["States", <span key="s" className="font-mono">{model.states}</span>]);
  if (model.alphabet !== null) facts.push(["Alphabet k", <span key="k2" className="font-mono">{model.alphabet}</span>]);
  if (model.radius !== null) facts.push(["Radius r", <span key="rr" className="font-mono">{model.radius}</span>]);
  if (model.block !== null) facts.push(["Block size N", <span key="n" className="font-mono">{model.block}</span>]);
  if (model.steps !== null) facts.push(["Steps T", <span key="t" className="font-mono">{model.steps}</span>]);
  if (base)
    facts.push([
      "Built on",
      <Link key="b" href={`/atlas/models/${base.id}`} className="text-tide-800 underline-offset-2 hover:underline">
        {base.name}
      </Link>,
    ]);
  if (tags.length)
    facts.push([
      "Tags",
      <span key="tg" className="flex flex-wrap gap-1">
        {tags.map((t) => (
          <Link key={t} href={`/atlas?tag=${encodeURIComponent(t)}`} className="rounded-full bg-tide-50 px-2 py-0.5 text-xs text-tide-800">
            {t}
          </Link>
        ))}
      </span>,
    ]);

  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <PageHeader
        eyebrow={
          <Link href="/atlas" className="underline-offset-2 hover:underline">
            Atlas
          </Link>
        }
        title={model.name}
        lead={model.description || undefined}
        actions={
          <>
            <WatchButton modelId={model.id} />
            <Link href={`/atlas/ask?from=${model.id}`} className="rounded-md px-3 py-1.5 text-sm font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50">
              Ask what it coarse-grains onto
            </Link>
            <DownloadJson json={model.canonical} filename={`model-${model.address.replace("sha256:", "").slice(0, 12)}.json`}>
              Download JSON
            </DownloadJson>
          </>
        }
      />

      <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.4fr)]">
        <Panel title="Model">
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-sm">
            {facts.map(([term, value]) => (
              <div key={term} className="contents">
                <dt className="text-ink-faint">{term}</dt>
                <dd className="min-w-0">{value}</dd>
              </div>
            ))}
          </dl>
        </Panel>
        <Panel title="Canonical form">
          <CanonicalModel view={view} />
          <details className="mt-4">
            <summary className="cursor-pointer text-sm text-tide-700">Canonical JSON (RFC 8785 is applied to this for the address)</summary>
            <div className="mt-2">
              <CopyBlock text={pretty} label="Canonical JSON of the model" />
            </div>
          </details>
        </Panel>
      </div>

      {rule ? (
        <Panel title="Space-time diagram">
          <SpaceTimeExplorer rule={rule} name={model.name} />
        </Panel>
      ) : null}

      {view.type === "markov" ? (
        <div className="grid grid-cols-1 gap-6 lg:grid-cols-2">
          <Panel title="Transition matrix as a heat map">
            <HeatMap labels={view.labels} matrix={view.matrix} caption="Darker is more likely; hover a cell for its exact value (row = from, column = to)." />
          </Panel>
          <Panel title="Stationary distributions (exact)">
            <StationaryView labels={view.labels} matrix={view.matrix} />
          </Panel>
        </div>
      ) : null}

      {view.type === "markov" ? (
        <div id="lumpings">
          <Panel title="Coarsest strong and exact lumpings">
            <LumpingComparison path={`/atlas/models/${model.id}`} labels={view.labels} matrix={view.matrix} keep={parseKeepApart(query.keep, view.matrix.length)} />
          </Panel>
        </div>
      ) : null}

      {view.type === "markov" && can(role, "job:create") ? (
        <Panel title="Find the coarsest lumping keeping states apart">
          <p className="mb-3 text-sm text-ink-soft">
            Starts a job that finds the coarsest strong lumping (Kemeny &amp; Snell 1960, §6.3) in which the ticked states stay in different blocks, and certifies it.
          </p>
          <LumpRequestForm action={findLumpingAction.bind(null, model.id)} labels={view.labels} />
        </Panel>
      ) : null}

      <Edges workspaceId={workspace.id} model={model} filters={filters} labels={view.type === "markov" ? view.labels : undefined} />

      {can(role, "model:create") ? (
        <Panel title="Name and description in this workspace">
          <details>
            <summary className="cursor-pointer text-sm text-tide-700">Edit the name and description</summary>
            <div className="mt-3 max-w-xl">
              <ModelDetailsForm action={updateModelDetailsAction.bind(null, model.id)} name={model.name} description={model.description} />
            </div>
          </details>
        </Panel>
      ) : null}

      <ModelAnnotations workspaceId={workspace.id} modelId={model.id} />

      <Suspense fallback={null}>
        <CompositeEdges workspaceId={workspace.id} modelId={model.id} />
      </Suspense>

      <Panel title="Recorded searches">
        <Suspense fallback={<Skeleton lines={2} label="Loading searches" />}>
          <Searches workspaceId={workspace.id} modelId={model.id} />
        </Suspense>
      </Panel>
    </div>
  );
}
