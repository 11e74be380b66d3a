"use client";

import { useActionState, useDeferredValue, useMemo, useReducer, useState } from "react";
import useSWR from "swr";
import { ChainCanvas } from "./chain-canvas";
import { chainCanvas } from "./chainCanvas";
import { checkChain, editorReducer, emptyEditor, nextCandidates, type EditorLink } from "./chainEditorState";
import { toEditorLink, type MapLike } from "./fromMapView";
import { idleChainState, type ChainActionState } from "./types";

type Action = (state: ChainActionState, form: FormData) => Promise<ChainActionState>;

async function fetchMaps(url: string): Promise<EditorLink[]> {
  const response = await fetch(url);
  if (!response.ok) throw new Error(`search failed (${response.status})`);
  const body = (await response.json()) as { items: MapLike[] };
  return body.items.map(toEditorLink);
}

const button = "rounded border border-line-strong px-1.5 py-0.5 text-xs text-ink-soft hover:bg-tide-50 disabled:opacity-40";

function linkText(link: EditorLink): string {
  return `${link.source.name} → ${link.target.name}`;
}

function kindText(link: EditorLink): string {
  return `${link.kind}${link.block !== null ? ` · N=${link.block}` : ""}${link.steps !== null && link.steps !== link.block && !(link.block === null && link.steps === 1) ? ` · T=${link.steps}` : ""}`;
}

/**
 * The chain editor: pick certified maps, order them, see at once which link does not meet the next,
 * and send the chain to the server, which re-verifies every link (and the composite where it fits)
 * before storing it.
 */
export function ChainEditor({
  pool,
  initial = [],
  action,
  canSubmit,
}: {
  pool: EditorLink[];
  /** Links to start with, e.g. a chain the atlas found between two models. */
  initial?: EditorLink[];
  action: Action;
  canSubmit: boolean;
}) {
  const [state, dispatch] = useReducer(editorReducer, initial, (links) => ({ ...emptyEditor, links }));
  const [filter, setFilter] = useState("");
  // Controlled, so the name survives the form reset React does after a refused submission.
  const [name, setName] = useState("");
  const [showAll, setShowAll] = useState(false);
  const [result, formAction, pending] = useActionState<ChainActionState, FormData>(async (prev, form) => {
    const answer = await action(prev, form);
    if (answer.status === "error") dispatch({ type: "server-problem", problem: { link: answer.link, message: answer.message } });
    return answer;
  }, idleChainState);

  // Maps beyond the first page come from the search API as the person types.
  const query = useDeferredValue(filter.trim());
  const { data: found, error: searchError } = useSWR(
    query.length >= 2 ? `/api/search?target=maps&limit=100&q=${encodeURIComponent(query)}` : null,
    fetchMaps,
    { keepPreviousData: true },
  );
  const allMaps = useMemo(() => {
    const byId = new Map(pool.map((m) => [m.mapId, m]));
    for (const m of found ?? []) if (!byId.has(m.mapId)) byId.set(m.mapId, m);
    return [...byId.values()];
  }, [pool, found]);

  const check = useMemo(() => checkChain(state.links), [state.links]);
  const canvas = useMemo(() => chainCanvas(state.links, check, state.problem?.link ?? null), [state.links, check, state.problem]);
  const offered = useMemo(() => {
    const base = showAll ? allMaps.filter((m) => m.status === "certified") : nextCandidates(state.links, allMaps);
    const needle = filter.trim().toLowerCase();
    return needle ? base.filter((m) => `${linkText(m)} ${m.kind} ${m.summary}`.toLowerCase().includes(needle)) : base;
  }, [allMaps, state.links, filter, showAll]);

  const nameError = result.status === "error" && result.field === "name" && state.problem ? result.message : null;
  const generalProblem = state.problem && state.problem.link === null && !nameError ? state.problem.message : null;

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
      <div className="lg:col-span-2">
        <h2 id="chain-heading" className="mb-2 text-sm font-semibold text-ink-soft">
          The chain
        </h2>
        <ChainCanvas nodes={canvas.nodes} edges={canvas.edges} />
      </div>
      <section aria-labelledby="chain-heading" className="min-w-0 space-y-4">

        <ol className="space-y-2" aria-label="Links of the chain">
          {state.links.map((link, i) => {
            const brk = check.breaks.find((b) => b.index === i);
            const serverProblem = state.problem?.link === i ? state.problem.message : null;
            const problemId = `link-${i}-problem`;
            const hasProblem = Boolean(brk || serverProblem || link.status === "retracted");
            return (
              <li
                key={`${link.mapId}-${i}`}
                className={`rounded-md border p-2 ${hasProblem ? "border-brick-600 bg-brick-50" : "border-line bg-paper-raised"}`}
                aria-describedby={hasProblem ? problemId : undefined}
              >
                <div className="flex flex-wrap items-center gap-2">
                  <span className="font-mono text-xs text-ink-faint">{i + 1}.</span>
                  <span className="text-sm font-medium text-ink">{linkText(link)}</span>
                  <span className="font-mono text-xs text-ink-faint">{kindText(link)}</span>
                  <span className="ml-auto flex gap-1">
                    <button type="button" className={button} disabled={i === 0} onClick={() => dispatch({ type: "move", from: i, to: i - 1 })} aria-label={`Move link ${i + 1} up`}>
                      ↑
                    </button>
                    <button type="button" className={button} disabled={i === state.links.length - 1} onClick={() => dispatch({ type: "move", from: i, to: i + 1 })} aria-label={`Move link ${i + 1} down`}>
                      ↓
                    </button>
                    <button type="button" className={button} onClick={() => dispatch({ type: "remove", index: i })} aria-label={`Remove link ${i + 1}`}>
                      Remove
                    </button>
                  </span>
                </div>
                {hasProblem ? (
                  <ul id={problemId} className="mt-1 space-y-0.5 text-xs text-brick-700" aria-live="polite">
                    {brk ? (
                      <li>
                        Does not meet link {i + 2}: this link ends at <strong>{brk.expected.name}</strong>, link {i + 2} starts at{" "}
                        <strong>{brk.found.name}</strong>.
                      </li>
                    ) : null}
                    {link.status === "retracted" ? <li>This map was retracted by a curator and cannot be used.</li> : null}
                    {serverProblem ? <li>Server: {serverProblem}</li> : null}
                  </ul>
                ) : null}
              </li>
            );
          })}
        </ol>

        <form action={formAction} className="space-y-3 rounded-md border border-line bg-paper-raised p-3">
          {state.links.map((link, i) => (
            <input key={i} type="hidden" name="mapId" value={link.mapId} />
          ))}
          <div className="flex flex-col gap-1">
            <label htmlFor="chain-name" className="text-xs font-medium text-ink-faint">
              Name of the chain
            </label>
            <input
              id="chain-name"
              name="name"
              value={name}
              onChange={(e) => setName(e.target.value)}
              required
              maxLength={200}
              placeholder="e.g. rule 146 onto rule 0 in two steps"
              className="rounded border border-line-strong px-2 py-1 text-sm"
              aria-invalid={nameError ? true : undefined}
              aria-describedby={nameError ? "chain-name-error" : undefined}
            />
            {nameError ? (
              <p id="chain-name-error" className="text-xs text-brick-700" aria-live="polite">
                {nameError}
              </p>
            ) : null}
          </div>
          {generalProblem ? (
            <p className="text-sm text-brick-700" role="alert">
              {generalProblem}
            </p>
          ) : null}
          <div className="flex items-center gap-3">
            <button
              type="submit"
              disabled={!check.ready || pending || !canSubmit}
              className="rounded bg-tide-700 px-3 py-1.5 text-sm font-medium text-paper-raised hover:bg-tide-800 disabled:cursor-not-allowed disabled:bg-line-strong"
            >
              {pending ? "Verifying…" : "Verify and store chain"}
            </button>
            <span className="text-xs text-ink-faint" aria-live="polite">
              {!canSubmit
                ? "Your role may not store chains (contributor or higher)."
                : state.links.length === 0
                  ? "No links yet."
                  : check.ready
                    ? `${state.links.length} link${state.links.length > 1 ? "s" : ""}; every link meets the next.`
                    : "Fix the marked links first."}
            </span>
          </div>
        </form>
      </section>

      <aside aria-labelledby="pool-heading" className="space-y-2">
        <h2 id="pool-heading" className="text-sm font-semibold text-ink-soft">
          Certified maps
        </h2>
        <input
          type="search"
          value={filter}
          onChange={(e) => setFilter(e.target.value)}
          placeholder="Filter by model or kind"
          aria-label="Filter certified maps"
          className="w-full rounded border border-line-strong px-2 py-1 text-sm"
        />
        <label className="flex items-center gap-2 text-xs text-ink-faint">
          <input type="checkbox" checked={showAll} onChange={(e) => setShowAll(e.target.checked)} />
          Show all maps, not only those continuing the chain
        </label>
        {searchError ? (
          <p className="text-xs text-brick-700" role="alert">
            The atlas search did not answer; showing the maps loaded with the page.
          </p>
        ) : null}
        <ul className="max-h-[32rem] space-y-1 overflow-auto pr-1" aria-label="Maps to add">
          {offered.length === 0 ? <li className="text-sm text-ink-faint">No certified map starts where the chain ends.</li> : null}
          {offered.map((m) => (
            <li key={m.mapId} className="flex items-center gap-2 rounded border border-line bg-paper-raised px-2 py-1">
              <div className="min-w-0 flex-1">
                <div className="truncate text-sm text-ink">{linkText(m)}</div>
                <div className="font-mono text-xs text-ink-faint">{kindText(m)}</div>
              </div>
              <button type="button" className={button} onClick={() => dispatch({ type: "append", link: m })} aria-label={`Add ${linkText(m)} (${kindText(m)})`}>
                Add
              </button>
            </li>
          ))}
        </ul>
      </aside>
    </div>
  );
}
