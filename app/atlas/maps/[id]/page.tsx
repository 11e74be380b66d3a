import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { bibtexEntry } from "@/components/atlas/bibtexEntry";
import { CanonicalModel } from "@/components/atlas/canonical-model";
import { canonicalView, prettyJson } from "@/components/atlas/canonicalView";
import { CopyBlock } from "@/components/atlas/copy-block";
import { DownloadJson } from "@/components/atlas/download-link";
import { MapKindBadge, StatusBadge } from "@/components/atlas/map-badges";
import { PageHeader } from "@/components/atlas/page-header";
import { RetractForm } from "@/components/atlas/retract-form";
import { SquarePreview } from "@/components/atlas/square-preview";
import { tikzSquare, type SquareInput } from "@/components/atlas/tikzSquare";
import { HeatMap } from "@/components/atlas/heat-map";
import { formatDate } from "@/components/atlas/formatDate";
import { guaranteeOf, power } from "@/components/atlas/guarantee";
import { CommutingPictureView } from "@/components/spacetime/commuting-picture";
import { pictureInputOf } from "@/components/spacetime/ruleViews";
import { Panel } from "@/components/ui/panel";
import { AnnotationsPanel } from "@/components/team/annotations-panel";
import { getCertificate, getMap, getModel } from "@/db/queries/atlas";
import { getUserById } from "@/db/queries/users";
import { env } from "@/env";
import { can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";
import { retractMapAction, reverifyMapAction } from "./actions";
import { ReverifyForm } from "@/components/atlas/reverify-form";
import { listCertificateChecks } from "@/db/queries/maps";
import { checkWords } from "@/components/atlas/checkWords";

type Props = { params: Promise<{ id: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const [{ id }, { workspace }] = await Promise.all([params, getWorkspaceContext()]);
  const map = await getMap({ workspaceId: workspace.id, mapId: id });
  return { title: map ? `${map.source.name} → ${map.target.name}` : "Map" };
}

const when = formatDate;

export default async function MapPage({ params }: Props) {
  const [{ id }, { workspace, role }] = await Promise.all([params, getWorkspaceContext()]);
  const map = await getMap({ workspaceId: workspace.id, mapId: id });
  if (!map) notFound();
  const [certificate, source, target, author, retractor, origin, checks] = await Promise.all([
    getCertificate({ address: map.certificateAddress }),
    getModel({ workspaceId: workspace.id, idOrAddress: map.sourceModelId }),
    getModel({ workspaceId: workspace.id, idOrAddress: map.targetModelId }),
    map.authorId ? getUserById({ id: map.authorId }) : null,
    map.retractedBy ? getUserById({ id: map.retractedBy }) : null,
    map.derivedFromMapId ? getMap({ workspaceId: workspace.id, mapId: map.derivedFromMapId }) : null,
    listCertificateChecks({ workspaceId: workspace.id, mapId: id }),
  ]);
  if (!certificate || !source || !target) notFound();

  const hex = certificate.address.replace(/^sha256:/, "");
  const square: SquareInput = { kind: map.kind, block: map.block, steps: map.steps, source, target, certificateAddress: certificate.address, certificate: certificate.body };
  const tikz = tikzSquare(square);
  const picture = map.kind === "projection" ? pictureInputOf(certificate.body) : null;
  const partition = map.kind === "lumping" ? partitionOf(certificate.body) : null;
  const bibtex = bibtexEntry({
    certificateAddress: certificate.address,
    claim: leadOf(map.summary, source.name, target.name),
    authorName: author?.name ?? null,
    workspaceName: workspace.name,
    checkerVersion: certificate.checkerVersion,
    verifiedAt: certificate.verifiedAt,
    url: `${env.APP_URL}/atlas/maps/${map.id}`,
  });

  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <PageHeader
        eyebrow={
          <span className="flex flex-wrap items-center gap-2">
            <Link href="/atlas?view=maps" className="underline-offset-2 hover:underline">
              Atlas
            </Link>
            <span aria-hidden>·</span> map <StatusBadge status={map.status} />
          </span>
        }
        title={
          <span className="flex flex-wrap items-baseline gap-x-3">
            <Link href={`/atlas/models/${source.id}`} className="hover:underline">
              {source.name}
            </Link>
            <span aria-label="coarse-grains onto" className="text-ink-faint">
              →
            </span>
            <Link href={`/atlas/models/${target.id}`} className="hover:underline">
              {target.name}
            </Link>
          </span>
        }
        lead={leadOf(map.summary, source.name, target.name)}
        actions={
          <DownloadJson json={certificate.body} filename={`certificate-${hex.slice(0, 12)}.json`}>
            Download certificate (JSON)
          </DownloadJson>
        }
      />

      {map.status === "retracted" ? (
        <div role="note" className="rounded-md border border-saffron-300 bg-saffron-100 px-4 py-3 text-sm text-saffron-700">
          <p className="font-semibold">Retracted{retractor ? ` by ${retractor.name}` : ""}{map.retractedAt ? ` on ${when(map.retractedAt)}` : ""}.</p>
          <p className="mt-1">Reason: {map.retractedReason}</p>
          <p className="mt-1 text-xs">The certificate still verifies; the map no longer counts in paths or answers.</p>
        </div>
      ) : null}

      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.4fr)]">
        <Panel title="Certificate">
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-sm">
            <dt className="text-ink-faint">Map</dt>
            <dd>
              <MapKindBadge kind={map.kind} block={map.block} steps={map.steps} />
            </dd>
            <dt className="text-ink-faint">Content address</dt>
            <dd className="break-all font-mono text-xs">{certificate.address}</dd>
            <dt className="text-ink-faint">Format version</dt>
            <dd className="font-mono">{certificate.formatVersion}</dd>
            <dt className="text-ink-faint">Checker</dt>
            <dd className="font-mono">{certificate.checkerVersion}</dd>
            <dt className="text-ink-faint">Verified</dt>
            <dd className="font-mono text-xs">{when(certificate.verifiedAt)}</dd>
            <dt className="text-ink-faint">Submitted by</dt>
            <dd>{author?.name ?? "—"}</dd>
            {origin ? (
              <>
                <dt className="text-ink-faint">Derived</dt>
                <dd>
                  by {map.derivation} from{" "}
                  <Link href={`/atlas/maps/${origin.id}`} className="text-tide-800 underline-offset-2 hover:underline">
                    {origin.source.name} → {origin.target.name}
                  </Link>{" "}
                  <span className="text-xs text-ink-faint">(re-verified by the same checker)</span>
                </dd>
              </>
            ) : null}
          </dl>
        </Panel>
        <Panel title="Commuting square · tikz-cd">
          <div className="mb-4 flex justify-center">
            <SquarePreview input={square} />
          </div>
          <CopyBlock text={tikz} label="tikz-cd source of the commuting square" wrap />
        </Panel>
      </div>

      <Panel title="What this certificate guarantees">
        <GuaranteeText kind={map.kind} block={map.block} steps={map.steps} filename={`certificate-${hex.slice(0, 12)}.json`} />
        <div className="mt-4 space-y-2 border-t border-line pt-3">
          <ReverifyForm action={reverifyMapAction.bind(null, map.id)} />
          {checks.length > 0 ? (
            <ul className="text-xs text-ink-faint">
              {checks.map((c, i) => (
                <li key={i}>
                  {formatDate(c.at)}: <span title={c.status}>{checkWords(c.status)}</span>
                  {c.checkerVersion ? ` · checker ${c.checkerVersion}` : ""}
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-xs text-ink-faint">Not re-verified since it was stored.</p>
          )}
        </div>
      </Panel>

      {picture ? (
        <Panel title="The square on one row">
          <CommutingPictureView {...picture} fineName={source.name} coarseName={target.name} />
        </Panel>
      ) : null}

      {source.kind === "markov" && target.kind === "markov" ? (
        <ChainsPanel source={source} target={target} kind={map.kind} steps={map.steps} partition={partition} />
      ) : null}
      <AnnotationsPanel workspaceId={workspace.id} role={role} subjectType="map" subjectId={map.id} />

      <Panel title="Certificate JSON">
        <CopyBlock text={prettyJson(certificate.body)} label="Certificate JSON" maxHeight="28rem" />
      </Panel>

      <Panel title="Cite this certificate (BibTeX)">
        <CopyBlock text={bibtex} label="BibTeX entry" wrap />
      </Panel>

      {can(role, "map:retract") && map.status === "certified" ? (
        <Panel title="Curator: retract">
          <RetractForm action={retractMapAction.bind(null, map.id)} />
        </Panel>
      ) : null}
    </div>
  );
}

/** The lumping's partition from its certificate body (block[i] = block of state i), or null. */
function partitionOf(body: string): number[] | null {
  try {
    const p = (JSON.parse(body) as { map?: { partition?: unknown } }).map?.partition;
    return Array.isArray(p) && p.every((x) => Number.isInteger(x)) ? (p as number[]) : null;
  } catch {
    return null;
  }
}

type ChainEnd = { name: string; canonical: string };

/**
 * Both chains as heat maps and exact matrices: a lumping outlines the partition's blocks on the
 * fine matrix; a decimation shows P beside P^k.
 */
function ChainsPanel({ source, target, kind, steps, partition }: { source: ChainEnd; target: ChainEnd; kind: string; steps: number | null; partition: number[] | null }) {
  const fine = canonicalView(source.canonical);
  const coarse = canonicalView(target.canonical);
  if (fine.type !== "markov" || coarse.type !== "markov") return null;
  const k = steps && steps > 1 ? steps : null;
  const fineCaption =
    kind === "lumping"
      ? `P of ${source.name}, states grouped by the partition's blocks (outlined)${k ? `; the lumping is of ${power("P", k)}` : ""}`
      : `P of ${source.name}`;
  const coarseCaption = kind === "lumping" ? `Q, the lumped chain: one state per block` : `${k ? power("P", k) : "P"}: ${k ?? 1} steps of P in one`;
  return (
    <Panel title={kind === "lumping" ? "The chain and its lumping" : "The chain and its decimation"}>
      <div className="grid gap-6 md:grid-cols-2">
        <div className="min-w-0 space-y-4">
          <p className="text-sm font-medium">{source.name}</p>
          <HeatMap labels={fine.labels} matrix={fine.matrix} partition={kind === "lumping" ? partition : null} caption={fineCaption} />
          <CanonicalModel view={fine} />
        </div>
        <div className="min-w-0 space-y-4">
          <p className="text-sm font-medium">{target.name}</p>
          <HeatMap labels={coarse.labels} matrix={coarse.matrix} caption={coarseCaption} />
          <CanonicalModel view={coarse} />
        </div>
      </div>
    </Panel>
  );
}

/** The stored summary ("ECA 146 → ECA 128: projection at block 3, 3 steps") with the models' current names. */
function leadOf(summary: string, sourceName: string, targetName: string): string {
  const at = summary.indexOf(": ");
  return at < 0 ? summary : `${sourceName} → ${targetName}: ${summary.slice(at + 2)}`;
}

/** The scope of the guarantee in plain words, and the one command that checks it again offline. */
function GuaranteeText({ kind, block, steps, filename }: { kind: string; block: number | null; steps: number | null; filename: string }) {
  const g = guaranteeOf(kind, block, steps);
  return (
    <div className="space-y-3 text-sm">
      <p>
        <span className="font-medium">It proves. </span>
        {g.proves}
      </p>
      <p className="text-ink-soft">
        <span className="font-medium text-ink">It does not prove. </span>
        {g.doesNot}
      </p>
      <div>
        <p className="mb-1 text-ink-soft">Check it yourself, offline, with the project&apos;s command-line verifier (prints the content address when the square commutes):</p>
        <CopyBlock text={`npm run --silent cli -- verify ${filename}`} label="Command that re-verifies the certificate offline" wrap />
      </div>
    </div>
  );
}
