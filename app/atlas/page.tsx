import type { Metadata } from "next";
import Link from "next/link";
import { Suspense } from "react";
import { AtlasFilterForm } from "@/components/atlas/atlas-filter-form";
import { atlasHref, parseAtlasFilters, type AtlasFilters } from "@/components/atlas/atlasFilters";
import { CursorPager } from "@/components/atlas/cursor-pager";
import { MapTable } from "@/components/atlas/map-table";
import { ModelTable, parseTags } from "@/components/atlas/model-table";
import { PageHeader } from "@/components/atlas/page-header";
import { Skeleton } from "@/components/atlas/skeleton";
import { searchAtlas, type MapKind, type ModelKind } from "@/db/queries/atlas";
import { MAP_KINDS, MODEL_KINDS } from "@/db/schema";
import { isAppError } from "@/server/errors";
import { getWorkspaceContext } from "@/server/context";
import { CompositeMaps } from "@/app/chains/composite-edges";

export const metadata: Metadata = { title: "Atlas" };

type View = "models" | "maps";

/** One click to each class of model: the 256 ECAs otherwise fill the first pages and hide the chains. */
const KIND_CHIPS: { kind: ModelKind | undefined; label: string }[] = [
  { kind: undefined, label: "every model" },
  { kind: "markov", label: "Markov chains" },
  { kind: "eca", label: "ECAs" },
  { kind: "ca", label: "1-D CAs" },
  { kind: "supercell", label: "supercells" },
  { kind: "iterate", label: "iterates" },
  { kind: "decimated-chain", label: "decimated chains" },
];

/** A JSON list of strings (a chain's state labels), or undefined when the text is not one. */
function stringList(text: string | null): string[] | undefined {
  if (!text) return undefined;
  try {
    const value: unknown = JSON.parse(text);
    return Array.isArray(value) && value.every((v) => typeof v === "string") ? value : undefined;
  } catch {
    return undefined;
  }
}

async function Results({ workspaceId, filters, view }: { workspaceId: string; filters: AtlasFilters; view: View }) {
  let result;
  try {
    result = await searchAtlas({
      workspaceId,
      target: view,
      q: filters.q,
      rule: filters.rule,
      symmetryClass: filters.class,
      tag: filters.tag,
      block: filters.block,
      mapKind: filters.mapKind as MapKind | undefined,
      modelKind: filters.kind as ModelKind | undefined,
      includeRetracted: view === "maps",
      constantTargets: view === "maps" ? (filters.constant ?? "exclude") : undefined,
      cursor: filters.cursor,
      limit: 40,
    });
  } catch (err) {
    if (isAppError(err) && err.field === "cursor") {
      const { cursor: _drop, ...rest } = filters;
      return (
        <p className="rounded-md bg-brick-50 px-3 py-2 text-sm text-brick-700" role="alert">
          This page link is out of date.{" "}
          <Link href={atlasHref({ ...rest, view })} className="font-medium underline">
            Back to the first page
          </Link>
        </p>
      );
    }
    throw err;
  }
  const pager = <CursorPager filters={{ ...filters, view }} nextCursor={result.nextCursor} />;
  const constantLine = result.target === "maps" ? <ConstantMapsLine filters={filters} folded={result.constantFolded ?? 0} /> : null;
  if (result.items.length === 0) {
    return (
      <div className="space-y-3">
        <p className="py-6 text-center text-sm text-ink-faint">Nothing in this atlas matches these filters.</p>
        {constantLine}
      </div>
    );
  }
  if (result.target === "models") {
    const rows = result.items.map((m) => ({ ...m, tags: parseTags(m.tags) }));
    return (
      <div className="space-y-3">
        <ModelTable rows={rows} />
        {pager}
      </div>
    );
  }
  const rows = result.items.map((m) => ({
    id: m.id,
    kind: m.kind,
    block: m.block,
    steps: m.steps,
    summary: m.summary,
    status: m.status,
    derivation: m.derivation,
    definition: m.definition,
    labels: stringList(m.sourceLabels),
    from: { id: m.source.id, name: m.source.name },
    other: { id: m.target.id, name: m.target.name },
  }));
  return (
    <div className="space-y-3">
      {constantLine}
      <MapTable rows={rows} otherHeading="Coarse-grains onto" empty="" />
      {pager}
      {filters.cursor ? null : <CompositeMaps workspaceId={workspaceId} kind={filters.mapKind} block={filters.block} q={filters.q} />}
    </div>
  );
}

/**
 * Nearly every rule coarse-grains onto the constant rules, so the maps list folds those maps into one
 * line that lists them (a URL parameter, so the unfolded list is linkable), as the dashboard does.
 */
function ConstantMapsLine({ filters, folded }: { filters: AtlasFilters; folded: number }) {
  const { cursor: _cursor, constant, ...rest } = filters;
  const link = "font-medium text-tide-800 underline";
  if (constant) {
    return (
      <p className="text-sm text-ink-soft" data-constant-maps={constant}>
        {constant === "only" ? "Only the maps onto the constant rules (ECA 0, ECA 255) are listed." : "The maps onto the constant rules (ECA 0, ECA 255) are listed."}{" "}
        <Link href={atlasHref({ ...rest, view: "maps" })} className={link}>
          Fold them
        </Link>
      </p>
    );
  }
  if (folded === 0) return null;
  return (
    <p className="text-sm text-ink-soft" data-constant-maps="folded">
      {folded} {folded === 1 ? "map" : "maps"} onto the constant rules (ECA 0, ECA 255) —{" "}
      <Link href={atlasHref({ ...rest, view: "maps", constant: "include" })} className={link}>
        show them
      </Link>{" "}
      or{" "}
      <Link href={atlasHref({ ...rest, view: "maps", constant: "only" })} className={link}>
        only them
      </Link>
    </p>
  );
}

export default async function AtlasPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const [{ workspace }, params] = await Promise.all([getWorkspaceContext(), searchParams]);
  const { filters, problems } = parseAtlasFilters(params, { mapKinds: MAP_KINDS, modelKinds: MODEL_KINDS });
  const view: View = filters.view ?? (filters.mapKind || filters.block !== undefined ? "maps" : "models");
  const { cursor: _cursor, view: _view, ...kept } = filters;

  return (
    <div className="mx-auto max-w-6xl space-y-5 px-5 py-8">
      <PageHeader
        eyebrow={workspace.name}
        title="Atlas"
        lead="Models are the nodes, certified maps the edges. Every edge carries a certificate that the server checked before storing it."
        actions={
          <>
            <Link href="/atlas/hierarchy" className="rounded-md px-3 py-1.5 text-sm font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50">
              ECA hierarchy
            </Link>
            <Link href="/atlas/smallest-block" className="rounded-md px-3 py-1.5 text-sm font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50">
              Smallest block sizes
            </Link>
            <Link href="/atlas/ask" className="rounded-md px-3 py-1.5 text-sm font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50">
              Ask the atlas
            </Link>
            <Link href="/atlas/exchange" className="rounded-md px-3 py-1.5 text-sm font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50">
              Export and import
            </Link>
          </>
        }
      />
      <AtlasFilterForm filters={kept} problems={problems} mapKinds={MAP_KINDS} modelKinds={MODEL_KINDS} />
      <div role="tablist" aria-label="What to list" className="flex gap-1 border-b border-line">
        {(["models", "maps"] as const).map((v) => (
          <Link
            key={v}
            role="tab"
            aria-selected={v === view}
            href={atlasHref({ ...kept, view: v })}
            className={`-mb-px border-b-2 px-3 py-1.5 text-sm font-medium ${
              v === view ? "border-tide-700 text-tide-900" : "border-transparent text-ink-faint hover:text-tide-700"
            }`}
          >
            {v === "models" ? "Models" : "Maps"}
          </Link>
        ))}
      </div>
      {view === "models" ? (
        <nav aria-label="Model class" className="flex flex-wrap items-center gap-1 text-sm">
          <span className="mr-1 text-ink-faint">Show:</span>
          {KIND_CHIPS.map((c) => (
            <Link
              key={c.label}
              href={atlasHref({ ...kept, kind: c.kind, view: "models" })}
              aria-current={c.kind === filters.kind ? "page" : undefined}
              className={`rounded-md px-2.5 py-1 ${c.kind === filters.kind ? "bg-tide-700 text-paper-raised" : "text-tide-700 hover:bg-tide-50"}`}
            >
              {c.label}
            </Link>
          ))}
        </nav>
      ) : null}
      <section className="rounded-[var(--radius-card)] border border-line bg-paper-raised p-4" aria-live="polite">
        <Suspense key={JSON.stringify({ filters, view })} fallback={<Skeleton lines={8} label="Loading the atlas" />}>
          <Results workspaceId={workspace.id} filters={filters} view={view} />
        </Suspense>
      </section>
    </div>
  );
}
