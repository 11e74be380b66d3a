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
import { Panel } from "@/components/ui/panel";
import { AnnotationsPanel } from "@/components/team/annotations-panel";
import { getCertificate, getMap, getModel } from "@/db/queries/atlas";
import { getUserById } from "@/db/queries/users";
import { env } from "@/env";
import { can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";
import { retractMapAction } from "./actions";

type Props = { params: Promise<{ id: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const [{ id }, { workspace }] = await Promise.all([params, getWorkspaceContext()]);
  const map = await getMap({ workspaceId: workspace.id, mapId: id });
  return { title: map ? `${map.source.name} → ${map.target.name}` : "Map" };
}

const when = (d: Date) => `${d.toISOString().slice(0, 19).replace("T", " ")} UTC`;

export default async function MapPage({ params }: Props) {
  const [{ id }, { workspace, role }] = await Promise.all([params, getWorkspaceContext()]);
  const map = await getMap({ workspaceId: workspace.id, mapId: id });
  if (!map) notFound();
  const [certificate, source, target, author, retractor, origin] = await Promise.all([
    getCertificate({ address: map.certificateAddress }),
    getModel({ workspaceId: workspace.id, idOrAddress: map.sourceModelId }),
    getModel({ workspaceId: workspace.id, idOrAddress: map.targetModelId }),
    map.authorId ? getUserById({ id: map.authorId }) : null,
    map.retractedBy ? getUserById({ id: map.retractedBy }) : null,
    map.derivedFromMapId ? getMap({ workspaceId: workspace.id, mapId: map.derivedFromMapId }) : null,
  ]);
  if (!certificate || !source || !target) notFound();

  const hex = certificate.address.replace(/^sha256:/, "");
  const square: SquareInput = { kind: map.kind, block: map.block, steps: map.steps, source, target, certificateAddress: certificate.address };
  const tikz = tikzSquare(square);
  const bibtex = bibtexEntry({
    certificateAddress: certificate.address,
    claim: map.summary,
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
        lead={map.summary}
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

      {source.kind === "markov" && target.kind === "markov" ? (
        <Panel title="The two chains">
          <div className="grid gap-6 md:grid-cols-2">
            <div className="min-w-0">
              <p className="mb-2 text-sm font-medium">{source.name}</p>
              <CanonicalModel view={canonicalView(source.canonical)} />
            </div>
            <div className="min-w-0">
              <p className="mb-2 text-sm font-medium">{target.name}</p>
              <CanonicalModel view={canonicalView(target.canonical)} />
            </div>
          </div>
        </Panel>
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
