import Link from "next/link";
import { verificationName } from "@/components/atlas/chainVerification";
import { CounterexampleView } from "@/components/counterexample/counterexample-view";

type Counts = { created?: number; existing?: number; refused?: { what: string; reason: string }[] };
type Result = {
  certificates?: Counts;
  found?: number;
  searchRecords?: number;
  searchRecord?: string;
  skipped?: string[];
  mapIds?: string[];
  chainId?: string;
  certificate?: { status?: string; mapId?: string; refused?: string } | null;
  states?: number;
  blocks?: number;
  partition?: number[];
  verification?: string;
  summary?: string;
  counterexample?: unknown;
  /** verify-chain, failed: the link at fault (0-based), or null for the composite. */
  link?: number | null;
  /** verify-map: the map it stored, or why not. */
  mapId?: string;
  status?: string;
  message?: string;
};

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;

/** What a finished job certified, created and recorded: counts, and links to those maps, chains and records. */
export function JobResultView({ result, params }: { result: unknown; params: unknown }) {
  if (!result || typeof result !== "object") return null;
  const r = result as Result;
  const rule = (params as { rule?: unknown })?.rule;
  const items: React.ReactNode[] = [];
  if (r.certificates) {
    const { created = 0, existing = 0, refused = [] } = r.certificates;
    items.push(
      <li key="certs">
        Certified {plural(created, "new map")}
        {existing ? `, ${existing} already in the atlas` : ""}
        {refused.length ? `; ${refused.length} refused by the checker` : ""}.{" "}
        {typeof rule === "number" ? (
          <Link href={`/atlas?rule=${rule}`} className="text-tide-800 underline">
            Rule {rule} in the atlas
          </Link>
        ) : (
          <Link href="/atlas" className="text-tide-800 underline">
            The atlas
          </Link>
        )}
        {refused.length ? (
          <ul className="ml-4 list-disc text-xs text-brick-700">
            {refused.slice(0, 10).map((x, i) => (
              <li key={i}>
                {x.what}: {x.reason}
              </li>
            ))}
          </ul>
        ) : null}
      </li>,
    );
  }
  if (typeof r.searchRecords === "number") items.push(<li key="records">Recorded {plural(r.searchRecords, "search record")} (what was searched, found or not).</li>);
  if (isEcaPartitionSweep(params))
    items.push(
      <li key="smallest">
        <Link href="/atlas/smallest-block" className="text-tide-800 underline">
          The smallest-block table
        </Link>{" "}
        (every ECA's smallest block size with a proper partition).
      </li>,
    );
  if (r.partition && typeof r.blocks === "number") {
    items.push(
      <li key="lump">
        Coarsest lumping: {r.states} states into {plural(r.blocks, "block")} <span className="font-mono">[{r.partition.map((b) => b + 1).join(", ")}]</span>.
      </li>,
    );
  }
  if (r.certificate?.mapId) {
    items.push(
      <li key="map">
        <Link href={`/atlas/maps/${r.certificate.mapId}`} className="text-tide-800 underline">
          The certified lumping
        </Link>{" "}
        ({r.certificate.status === "existing" ? "already in the atlas" : "new"}).
      </li>,
    );
  } else if (r.certificate?.refused) items.push(<li key="refused">The lumping was refused: {r.certificate.refused}</li>);
  if (r.mapId) {
    items.push(
      <li key="one-map">
        <Link href={`/atlas/maps/${r.mapId}`} className="text-tide-800 underline">
          The certified map
        </Link>{" "}
        ({r.status === "existing" ? "already in the atlas" : "new"}){r.summary ? `: ${r.summary}` : ""}.
      </li>,
    );
  } else if (r.message) items.push(<li key="message">{r.message}</li>);
  if (r.searchRecord) items.push(<li key="record">Search record: {r.searchRecord}.</li>);
  if (r.mapIds?.length) {
    items.push(
      <li key="maps">
        {plural(r.mapIds.length, "map")}:{" "}
        {r.mapIds.map((id, i) => (
          <Link key={id} href={`/atlas/maps/${id}`} className="mr-2 text-tide-800 underline">
            link {i + 1}
          </Link>
        ))}
      </li>,
    );
  }
  if (r.chainId) {
    items.push(
      <li key="chain">
        <Link href={`/chains/${r.chainId}`} className="text-tide-800 underline">
          The stored chain
        </Link>
        {r.verification ? (
          <>
            {" "}
            (<span title={r.verification}>{verificationName(r.verification)}</span>)
          </>
        ) : null}
        .
      </li>,
    );
  } else if (r.summary && !r.mapId) items.push(<li key="summary">{r.summary}</li>);
  if (r.skipped?.length) items.push(<li key="skipped">{plural(r.skipped.length, "finding")} skipped.</li>);
  return (
    <div className="space-y-2" data-job-result>
      {items.length ? <ul className="space-y-1 text-sm">{items}</ul> : null}
      {r.counterexample ? <CounterexampleView counterexample={r.counterexample} labels={linkLabels(params, r.link)} /> : null}
    </div>
  );
}

/** An ECA atlas run over partitions (no single rule): its records fill the smallest-block table. */
function isEcaPartitionSweep(params: unknown): boolean {
  const p = params as { rule?: unknown; search?: unknown; minBlock?: unknown } | null;
  return !!p && p.rule === undefined && (p.search === "partitions" || p.search === "both") && (p.minBlock ?? 2) === 2;
}

/** The state labels of the failing link's source chain (verify-chain), to name a lumping's states by label. */
function linkLabels(params: unknown, link: number | null | undefined): string[] | undefined {
  const certificates = (params as { certificates?: unknown })?.certificates;
  if (!Array.isArray(certificates)) return undefined;
  const labels = (certificates[link ?? 0] as { source?: { labels?: unknown } } | undefined)?.source?.labels;
  return Array.isArray(labels) && labels.every((l) => typeof l === "string") ? labels : undefined;
}
