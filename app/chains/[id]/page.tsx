import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { bibtexEntry } from "@/components/atlas/bibtexEntry";
import { prettyJson } from "@/components/atlas/canonicalView";
import { CopyBlock } from "@/components/atlas/copy-block";
import { DownloadJson } from "@/components/atlas/download-link";
import { MapKindBadge, StatusBadge } from "@/components/atlas/map-badges";
import { PageHeader } from "@/components/atlas/page-header";
import { SquarePreview } from "@/components/atlas/square-preview";
import { tikzSquare, type SquareInput } from "@/components/atlas/tikzSquare";
import { Panel } from "@/components/ui/panel";
import { getCertificate, getChain, getModel } from "@/db/queries/atlas";
import { getUserById } from "@/db/queries/users";
import { env } from "@/env";
import { getWorkspaceContext } from "@/server/context";
import { VERIFICATION_NAME, VERIFICATION_SENTENCE } from "@/components/atlas/chainVerification";

type Props = { params: Promise<{ id: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const [{ id }, { workspace }] = await Promise.all([params, getWorkspaceContext()]);
  const chain = await getChain({ workspaceId: workspace.id, chainId: id });
  return { title: chain?.name ?? "Chain" };
}

/** Block sizes and steps multiply along a chain (DOMAIN §3), when every link has one. */
function product(values: (number | null)[]): number | null {
  return values.length > 0 && values.every((v) => v !== null) ? values.reduce<number>((a, v) => a * (v as number), 1) : null;
}

export default async function ChainPage({ params }: Props) {
  const [{ id }, { workspace }] = await Promise.all([params, getWorkspaceContext()]);
  const chain = await getChain({ workspaceId: workspace.id, chainId: id });
  if (!chain || chain.links.length === 0) notFound();
  const first = chain.links[0];
  const last = chain.links[chain.links.length - 1];
  const [composite, source, target, author] = await Promise.all([
    getCertificate({ address: chain.compositeCertificateAddress }),
    getModel({ workspaceId: workspace.id, idOrAddress: first.sourceModelId }),
    getModel({ workspaceId: workspace.id, idOrAddress: last.targetModelId }),
    chain.authorId ? getUserById({ id: chain.authorId }) : null,
  ]);
  if (!composite || !source || !target) notFound();

  const kinds = new Set(chain.links.map((l) => l.kind));
  const kind = kinds.size === 1 ? first.kind : composite.kind;
  const square: SquareInput = {
    kind,
    block: product(chain.links.map((l) => l.block)),
    steps: product(chain.links.map((l) => l.steps ?? l.block)),
    source,
    target,
    certificateAddress: composite.address,
    certificate: composite.body,
  };
  const tikz = tikzSquare(square);
  const hex = composite.address.replace(/^sha256:/, "");
  const bibtex = bibtexEntry({
    certificateAddress: composite.address,
    claim: `${source.name} coarse-grains onto ${target.name} through a chain of ${chain.links.length} certified maps`,
    authorName: author?.name ?? null,
    workspaceName: workspace.name,
    checkerVersion: composite.checkerVersion,
    verifiedAt: composite.verifiedAt,
    url: `${env.APP_URL}/chains/${chain.id}`,
  });

  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <PageHeader
        eyebrow={
          <span>
            Chain of {chain.links.length} maps · <Link href={`/chains/workbench?maps=${chain.links.map((l) => l.id).join(",")}`} className="underline-offset-2 hover:underline">open on the workbench</Link>
          </span>
        }
        title={chain.name}
        lead={
          <>
            <Link href={`/atlas/models/${source.id}`} className="font-medium text-tide-800 hover:underline">
              {source.name}
            </Link>{" "}
            →{" "}
            <Link href={`/atlas/models/${target.id}`} className="font-medium text-tide-800 hover:underline">
              {target.name}
            </Link>
          </>
        }
        actions={
          <DownloadJson json={composite.body} filename={`composite-${hex.slice(0, 12)}.json`}>
            Download composite (JSON)
          </DownloadJson>
        }
      />

      <div className="grid gap-6 lg:grid-cols-[minmax(0,1.2fr)_minmax(0,1fr)]">
        <Panel title="Links">
          <ol className="space-y-2">
            {chain.links.map((m, i) => (
              <li key={`${m.id}-${i}`} className="flex flex-wrap items-center gap-2 border-b border-line/60 pb-2 text-sm">
                <span className="w-5 font-mono text-xs text-ink-faint">{i + 1}.</span>
                <span className="font-medium">
                  {m.source.name} → {m.target.name}
                </span>
                <MapKindBadge kind={m.kind} block={m.block} steps={m.steps} />
                {m.status === "retracted" ? <StatusBadge status="retracted" /> : null}
                <Link href={`/atlas/maps/${m.id}`} className="ml-auto text-xs text-ink-faint underline-offset-2 hover:underline">
                  certificate →
                </Link>
              </li>
            ))}
          </ol>
          {chain.links.some((m) => m.status === "retracted") ? (
            <p className="mt-3 rounded-md bg-saffron-100 px-3 py-2 text-sm text-saffron-700">
              A link of this chain was retracted after the chain was stored. The composite certificate still verifies on its own terms.
            </p>
          ) : null}
        </Panel>
        <Panel title="Verification">
          <p className="mb-3">
            <span
              className="rounded-md bg-moss-50 px-2 py-1 text-sm font-semibold text-moss-700 ring-1 ring-moss-700/30"
              data-verification={chain.verification}
              title={chain.verification}
            >
              {VERIFICATION_NAME[chain.verification]}
            </span>
          </p>
          <p className="text-sm text-ink-soft">{VERIFICATION_SENTENCE[chain.verification]}</p>
          <dl className="mt-4 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1.5 text-sm">
            <dt className="text-ink-faint">Composite</dt>
            <dd className="break-all font-mono text-xs">{composite.address}</dd>
            <dt className="text-ink-faint">Checker</dt>
            <dd className="font-mono">{composite.checkerVersion}</dd>
            <dt className="text-ink-faint">Verified</dt>
            <dd className="font-mono text-xs">{composite.verifiedAt.toISOString().slice(0, 19).replace("T", " ")} UTC</dd>
            <dt className="text-ink-faint">Stored by</dt>
            <dd>{author?.name ?? "—"}</dd>
          </dl>
        </Panel>
      </div>

      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <Panel title="Outer square · tikz-cd">
          <div className="mb-4 flex justify-center">
            <SquarePreview input={square} />
          </div>
          <CopyBlock text={tikz} label="tikz-cd source of the outer square" wrap />
        </Panel>
        <Panel title="Cite the composite (BibTeX)">
          <CopyBlock text={bibtex} label="BibTeX entry" wrap />
        </Panel>
      </div>

      <Panel title="Composite certificate JSON">
        <CopyBlock text={prettyJson(composite.body)} label="Composite certificate JSON" maxHeight="28rem" />
      </Panel>
    </div>
  );
}
