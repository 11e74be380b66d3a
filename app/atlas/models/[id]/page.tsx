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
import { CompositeEdges } from "@/app/chains/composite-edges";
import { Panel } from "@/components/ui/panel";
import { WatchButton } from "@/components/watch-button";
import { getModel, listMapsFrom, listMapsTo, listSearchRecords, type MapView } from "@/db/queries/atlas";
import { getWorkspaceContext } from "@/server/context";

type Props = { params: Promise<{ id: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const [{ id }, { workspace }] = await Promise.all([params, getWorkspaceContext()]);
  const model = await getModel({ workspaceId: workspace.id, idOrAddress: decodeURIComponent(id) });
  return { title: model?.name ?? "Model" };
}

function rowsOf(items: MapView[], end: "source" | "target"): MapRow[] {
  return items.map((m) => ({
    id: m.id,
    kind: m.kind,
    block: m.block,
    steps: m.steps,
    summary: m.summary,
    status: m.status,
    derivation: m.derivation,
    other: { id: m[end].id, name: m[end].name },
  }));
}

async function Edges({ workspaceId, modelId }: { workspaceId: string; modelId: string }) {
  const [from, to] = await Promise.all([
    listMapsFrom({ workspaceId, modelId, includeRetracted: true, limit: 200 }),
    listMapsTo({ workspaceId, modelId, includeRetracted: true, limit: 200 }),
  ]);
  const more = (next: string | null) =>
    next ? <p className="mt-2 text-xs text-ink-faint">Showing the first 200; search the atlas for the rest.</p> : null;
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <Panel title={`Coarse-grains onto (${from.items.length}${from.nextCursor ? "+" : ""})`}>
        <MapTable rows={rowsOf(from.items, "target")} otherHeading="Target" empty="No certified map starts at this model yet." />
        {more(from.nextCursor)}
      </Panel>
      <Panel title={`Coarse-grained from (${to.items.length}${to.nextCursor ? "+" : ""})`}>
        <MapTable rows={rowsOf(to.items, "source")} otherHeading="Source" empty="No certified map ends at this model yet." />
        {more(to.nextCursor)}
      </Panel>
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
          <span className="font-mono text-xs text-ink-soft">{r.kind}</span>
          <span>{r.maxBlock !== null ? <>block sizes up to N = {r.maxBlock}</> : "no block bound"}</span>
          <span className="text-ink-soft">
            {r.found} target{r.found === 1 ? "" : "s"} found
          </span>
          <span className="ml-auto font-mono text-xs text-ink-faint">
            {r.algorithm} {r.algorithmVersion} · {r.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC
          </span>
        </li>
      ))}
    </ul>
  );
}

export default async function ModelPage({ params }: Props) {
  const [{ id }, { workspace }] = await Promise.all([params, getWorkspaceContext()]);
  const model = await getModel({ workspaceId: workspace.id, idOrAddress: decodeURIComponent(id) });
  if (!model) notFound();
  const base = model.baseModelId ? await getModel({ workspaceId: workspace.id, idOrAddress: model.baseModelId }) : null;
  const tags = parseTags(model.tags);
  const pretty = prettyJson(model.canonical);

  const facts: [string, React.ReactNode][] = [
    ["Content address", <span key="a" className="break-all font-mono text-xs">{model.address}</span>],
    ["Class", <span key="k" className="font-mono">{model.kind}</span>],
  ];
  if (model.rule !== null) facts.push(["Rule", <span key="r" className="font-mono">{model.rule}</span>]);
  if (model.symmetryClass !== null)
    facts.push([
      "Symmetry class",
      <Link key="c" href={`/atlas?class=${model.symmetryClass}`} className="font-mono text-tide-800 underline-offset-2 hover:underline">
        {model.symmetryClass}
      </Link>,
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

      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.4fr)]">
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
          <CanonicalModel view={canonicalView(model.canonical)} />
          <details className="mt-4">
            <summary className="cursor-pointer text-sm text-tide-700">Canonical JSON (RFC 8785 is applied to this for the address)</summary>
            <div className="mt-2">
              <CopyBlock text={pretty} label="Canonical JSON of the model" />
            </div>
          </details>
        </Panel>
      </div>

      <Suspense fallback={<Skeleton lines={6} label="Loading maps" />}>
        <Edges workspaceId={workspace.id} modelId={model.id} />
      </Suspense>

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
