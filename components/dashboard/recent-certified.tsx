import Link from "next/link";

/** A certified map as the dashboard lists it (a plain view type: pages hand it over from the query layer). */
export type RecentMapLine = { id: string; kind: string; block: number | null; sourceName: string; targetName: string; authorName: string | null; createdAt: Date };
export type RecentChainLine = { id: string; name: string; authorName: string | null; createdAt: Date };

const DAY = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeZone: "UTC" });

function MapLine({ m }: { m: RecentMapLine }) {
  return (
    <li className="flex flex-wrap items-baseline justify-between gap-x-3 py-2">
      <Link href={`/atlas/maps/${m.id}`} className="min-w-0 text-sm font-medium text-tide-800 hover:underline">
        {m.sourceName} → {m.targetName}, {m.kind}
        {m.block ? ` at block ${m.block}` : ""}
      </Link>
      <span className="text-xs text-ink-faint">
        {m.authorName ?? "someone"} · {DAY.format(m.createdAt)}
      </span>
    </li>
  );
}

const START = [
  { href: "/chains/workbench", text: "Draw a model and a map in the workbench", then: "the server checks the square and stores the certificate." },
  { href: "/jobs", text: "Start a search job", then: "for instance every coarse-graining of the 256 ECAs up to block 3." },
  { href: "/atlas/exchange", text: "Import an exported atlas", then: "every certificate in it is checked again." },
];

/** An empty workspace says where a first certified map comes from. */
function GettingStarted() {
  return (
    <div className="text-sm text-ink-soft">
      <p>No certified map yet. A first one comes from any of these:</p>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        {START.map((s) => (
          <li key={s.href}>
            <Link href={s.href} className="font-medium text-tide-700 underline-offset-2 hover:underline">
              {s.text}
            </Link>
            : {s.then}
          </li>
        ))}
      </ul>
    </div>
  );
}

/**
 * The newest certified maps and chains. Maps onto the constant rules (ECA 0, ECA 255) are folded into
 * one line that opens: nearly every rule has them, and listed one by one they hide the rest.
 */
export function RecentCertified({ maps, constant, chains }: { maps: RecentMapLine[]; constant: { count: number; recent: RecentMapLine[] }; chains: RecentChainLine[] }) {
  if (maps.length === 0 && chains.length === 0 && constant.count === 0) return <GettingStarted />;
  return (
    <ul className="divide-y divide-line" aria-label="Recently certified">
      {maps.map((m) => (
        <MapLine key={m.id} m={m} />
      ))}
      {chains.map((c) => (
        <li key={c.id} className="flex flex-wrap items-baseline justify-between gap-x-3 py-2">
          <Link href={`/chains/${c.id}`} className="min-w-0 text-sm font-medium text-tide-800 hover:underline">
            Chain “{c.name}”
          </Link>
          <span className="text-xs text-ink-faint">
            {c.authorName ?? "someone"} · {DAY.format(c.createdAt)}
          </span>
        </li>
      ))}
      {constant.count > 0 ? (
        <li className="py-2">
          <details className="group">
            <summary className="cursor-pointer text-sm text-ink-soft hover:text-tide-700">
              {constant.count} {constant.count === 1 ? "map" : "maps"} onto the constant rules (ECA 0, ECA 255)
              <span className="sr-only group-open:hidden"> (show the newest)</span>
            </summary>
            <ul className="mt-1 divide-y divide-line border-l-2 border-tide-100 pl-3" aria-label="Maps onto the constant rules">
              {constant.recent.map((m) => (
                <MapLine key={m.id} m={m} />
              ))}
            </ul>
            {constant.count > constant.recent.length ? (
              <p className="mt-1 pl-3 text-xs text-ink-faint">
                The newest {constant.recent.length}; every model page lists its own under “Coarse-grains onto”.
              </p>
            ) : null}
          </details>
        </li>
      ) : null}
    </ul>
  );
}
