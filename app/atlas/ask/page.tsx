import type { Metadata } from "next";
import Link from "next/link";
import { Suspense } from "react";
import { prettyJson } from "@/components/atlas/canonicalView";
import { CopyBlock } from "@/components/atlas/copy-block";
import { decideAsk, type AskAnswer } from "@/components/atlas/decideAsk";
import { MapKindBadge } from "@/components/atlas/map-badges";
import { PageHeader } from "@/components/atlas/page-header";
import { targetInScope } from "@/components/atlas/searchScope";
import { Skeleton } from "@/components/atlas/skeleton";
import { distinctNames } from "@/components/ui/distinctNames";
import { Panel } from "@/components/ui/panel";
import { findPaths, getMap, listSearchRecords, MAX_PATH_DEPTH, type MapView } from "@/db/queries/atlas";
import { findModelByText, type ModelLookup } from "@/db/queries/views";
import type { Model } from "@/db/schema";
import { getWorkspaceContext } from "@/server/context";
import { searchKindWords } from "@/components/atlas/searchKindWords";

export const metadata: Metadata = { title: "Ask the atlas" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v) ?? "";
const input = "block w-full rounded-md border bg-paper-raised px-3 py-2 text-sm";

function LookupProblem({ id, lookup, text, hrefFor }: { id: string; lookup: ModelLookup | null; text: string; hrefFor: (modelId: string) => string }) {
  if (!lookup || lookup.status === "found") return <div id={id} aria-live="polite" />;
  return (
    <div id={id} aria-live="polite" className="text-sm text-brick-700">
      {lookup.status === "none" ? (
        <p>No model in this atlas matches “{text}”.</p>
      ) : (
        <>
          <p>“{text}” matches several models; choose one:</p>
          <ul className="mt-1 flex flex-wrap gap-2" aria-label={`Models matching ${text}`}>
            {distinctNames(lookup.choices).map((m) => (
              <li key={m.id}>
                <Link href={hrefFor(m.id)} className="rounded-md px-2 py-0.5 text-tide-800 ring-1 ring-line-strong hover:bg-tide-50" title={m.description || undefined}>
                  {m.label} {m.label === m.name ? <span className="font-mono text-xs text-ink-faint">{m.kind}</span> : null}
                </Link>
              </li>
            ))}
          </ul>
        </>
      )}
    </div>
  );
}

function askHref(from: string, to: string, depth: string): string {
  return `/atlas/ask?${new URLSearchParams({ from, to, depth }).toString()}`;
}

const VERDICT: Record<AskAnswer["answer"], { label: string; tone: string }> = {
  yes: { label: "Yes", tone: "bg-moss-50 text-moss-700 ring-moss-700/30" },
  no: { label: "No, within stated bounds", tone: "bg-brick-50 text-brick-700 ring-brick-600/30" },
  unknown: { label: "Unknown", tone: "bg-saffron-100 text-saffron-700 ring-saffron-300" },
};

function ChainList({ links }: { links: MapView[] }) {
  return (
    <ol className="space-y-1.5">
      {links.map((m, i) => (
        <li key={m.id} className="flex flex-wrap items-center gap-2 text-sm">
          <span className="w-5 font-mono text-xs text-ink-faint">{i + 1}.</span>
          <Link href={`/atlas/models/${m.source.id}`} className="font-medium text-tide-800 hover:underline">
            {m.source.name}
          </Link>
          <span className="text-ink-faint">→</span>
          <Link href={`/atlas/models/${m.target.id}`} className="font-medium text-tide-800 hover:underline">
            {m.target.name}
          </Link>
          <MapKindBadge kind={m.kind} block={m.block} steps={m.steps} />
          <Link href={`/atlas/maps/${m.id}`} className="text-xs text-ink-faint underline-offset-2 hover:underline">
            certificate →
          </Link>
        </li>
      ))}
    </ol>
  );
}

async function Answer({ workspaceId, a, b, depth }: { workspaceId: string; a: Model; b: Model; depth: number }) {
  const [paths, records] = await Promise.all([
    a.id === b.id ? Promise.resolve([]) : findPaths({ workspaceId, from: a.id, to: b.id, maxDepth: depth, limit: 20 }),
    listSearchRecords({ workspaceId, modelId: a.id }),
  ]);
  const answer = decideAsk({
    sameModel: a.id === b.id,
    paths,
    records,
    targetAddress: b.address,
    targetInScope: (record, coverage) => targetInScope(record, coverage, b.kind),
  });
  const links =
    answer.answer === "yes" && answer.reason === "chain"
      ? (await Promise.all(answer.mapIds.map((mapId) => getMap({ workspaceId, mapId })))).filter((m): m is MapView => m !== null)
      : [];
  const verdict = VERDICT[answer.answer];

  return (
    <Panel>
      <div className="flex flex-wrap items-center gap-3">
        <span className={`rounded-md px-3 py-1 text-lg font-semibold ring-1 ${verdict.tone}`} data-answer={answer.answer}>
          {verdict.label}
        </span>
        <span className="text-sm text-ink-soft">
          Does <strong>{a.name}</strong> coarse-grain onto <strong>{b.name}</strong>?
        </span>
      </div>
      <div className="mt-4 space-y-3 text-sm text-ink-soft">
        {answer.answer === "yes" && answer.reason === "same-model" ? <p>They are the same model: the identity map is a coarse-graining of anything onto itself.</p> : null}
        {answer.answer === "yes" && answer.reason === "chain" ? (
          <>
            <p>
              A chain of {links.length} certified map{links.length === 1 ? "" : "s"} leads from {a.name} to {b.name}. Each square commutes, so the
              outer rectangle does.
              {answer.otherChains > 0 ? ` ${answer.otherChains} other chain${answer.otherChains === 1 ? "" : "s"} of at most ${depth} maps also exist.` : ""}
            </p>
            <ChainList links={links} />
            {links.length > 1 ? (
              <Link href={`/chains/workbench?maps=${answer.mapIds.join(",")}`} className="inline-block rounded-md bg-tide-700 px-3 py-1.5 text-sm font-semibold text-paper-raised hover:bg-tide-800">
                Compose and certify this chain
              </Link>
            ) : null}
          </>
        ) : null}
        {answer.answer === "no" ? (
          <>
            <p>
              No chain of at most {depth} certified maps leads from {a.name} to {b.name}, and a recorded exhaustive search from {a.name}
              {answer.maxBlock !== null ? ` over every block size up to N = ${answer.maxBlock}` : ""} (<span title={answer.record.kind}>{searchKindWords(answer.record.kind)}</span>) found{" "}
              {answer.record.found} target{answer.record.found === 1 ? "" : "s"}, none of them {b.name}. So: no such coarse-graining within those bounds. Larger block
              sizes are not covered.
            </p>
            <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
              <dt className="text-ink-faint">Search</dt>
              <dd className="font-mono text-xs">
                {answer.record.algorithm} {answer.record.algorithmVersion}
              </dd>
              <dt className="text-ink-faint">Recorded</dt>
              <dd className="font-mono text-xs">{answer.record.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC</dd>
            </dl>
            <CopyBlock text={prettyJson(answer.record.coverage)} label="What the search covered" maxHeight="12rem" />
          </>
        ) : null}
        {answer.answer === "unknown" ? (
          <>
            <p>
              Nothing in the atlas settles this yet. No chain of at most {depth} certified maps leads from {a.name} to {b.name}
              {answer.reason === "no-search"
                ? `, and no exhaustive search from ${a.name} has been recorded.`
                : `, and none of the ${answer.searched} recorded search${answer.searched === 1 ? "" : "es"} from ${a.name} covers a target like ${b.name} (or one found it but its map is not stored).`}
            </p>
            <p>
              Try a greater depth, or run a search from{" "}
              <Link href={`/atlas/models/${a.id}`} className="text-tide-800 underline">
                {a.name}
              </Link>{" "}
              as a <Link href="/jobs" className="text-tide-800 underline">job</Link>.
            </p>
          </>
        ) : null}
      </div>
    </Panel>
  );
}

export default async function AskPage({ searchParams }: Props) {
  const [{ workspace }, params] = await Promise.all([getWorkspaceContext(), searchParams]);
  const fromText = one(params.from);
  const toText = one(params.to);
  const depthText = one(params.depth) || "4";
  const depthOk = /^\d+$/.test(depthText) && Number(depthText) >= 1 && Number(depthText) <= MAX_PATH_DEPTH;
  const depth = depthOk ? Number(depthText) : 4;
  const [from, to] = await Promise.all([
    fromText ? findModelByText({ workspaceId: workspace.id, text: fromText }) : null,
    toText ? findModelByText({ workspaceId: workspace.id, text: toText }) : null,
  ]);
  const ready = from?.status === "found" && to?.status === "found" && depthOk;
  const fromValue = from?.status === "found" ? from.model.name : fromText;
  const toValue = to?.status === "found" ? to.model.name : toText;

  return (
    <div className="mx-auto max-w-4xl space-y-5 px-5 py-8">
      <PageHeader
        eyebrow={
          <Link href="/atlas" className="underline-offset-2 hover:underline">
            Atlas
          </Link>
        }
        title="Does A coarse-grain onto B?"
        lead="The atlas answers yes (with a chain of certified maps), no within stated bounds (with the exhaustive search that found none), or unknown — and says which."
      />
      <form method="get" action="/atlas/ask" className="grid gap-3 rounded-[var(--radius-card)] border border-line bg-paper-raised p-4 sm:grid-cols-[1fr_1fr_7rem_auto] sm:items-start">
        <div className="space-y-1">
          <label htmlFor="ask-from" className="block text-sm font-medium">
            A (finer model)
          </label>
          <input id="ask-from" name="from" defaultValue={fromValue} required placeholder="ECA 146, a name, or sha256:…" aria-describedby="ask-from-error" aria-invalid={from && from.status !== "found" ? true : undefined} className={`${input} ${from && from.status !== "found" ? "border-brick-600" : "border-line-strong"}`} />
          <LookupProblem id="ask-from-error" lookup={from} text={fromText} hrefFor={(id) => askHref(id, toText, depthText)} />
        </div>
        <div className="space-y-1">
          <label htmlFor="ask-to" className="block text-sm font-medium">
            B (coarser model)
          </label>
          <input id="ask-to" name="to" defaultValue={toValue} required placeholder="ECA 128" aria-describedby="ask-to-error" aria-invalid={to && to.status !== "found" ? true : undefined} className={`${input} ${to && to.status !== "found" ? "border-brick-600" : "border-line-strong"}`} />
          <LookupProblem id="ask-to-error" lookup={to} text={toText} hrefFor={(id) => askHref(fromText, id, depthText)} />
        </div>
        <div className="space-y-1">
          <label htmlFor="ask-depth" className="block text-sm font-medium">
            Max. links
          </label>
          <input id="ask-depth" name="depth" type="number" min={1} max={MAX_PATH_DEPTH} defaultValue={depthText} aria-describedby="ask-depth-error" aria-invalid={!depthOk || undefined} className={`${input} ${depthOk ? "border-line-strong" : "border-brick-600"}`} />
          <div id="ask-depth-error" aria-live="polite" className="text-sm text-brick-700">
            {depthOk ? null : <p>From 1 to {MAX_PATH_DEPTH}.</p>}
          </div>
        </div>
        <button type="submit" className="rounded-md bg-tide-700 px-4 py-2 text-sm font-semibold text-paper-raised hover:bg-tide-800 sm:mt-6">
          Ask
        </button>
      </form>
      {ready ? (
        <Suspense key={`${from.model.id}:${to.model.id}:${depth}`} fallback={<Skeleton lines={4} label="Looking for chains and searches" />}>
          <Answer workspaceId={workspace.id} a={from.model} b={to.model} depth={depth} />
        </Suspense>
      ) : null}
    </div>
  );
}
