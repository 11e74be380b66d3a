"use client";

import { useState } from "react";
import useSWR from "swr";
import { buttonClass } from "@/components/ui/button";

type WatchState = { modelId: string; watching: boolean; watchers: number };

async function readJson(response: Response): Promise<WatchState> {
  const body = await response.json();
  if (!response.ok) throw new Error(body?.error?.message ?? `request failed (${response.status})`);
  return body as WatchState;
}

/**
 * Watch or unwatch a model: a watcher gets mail when a new certified map starts or ends at it.
 * Place it on the model page with the state read on the server as `initial`.
 */
export function WatchButton({ modelId, initial }: { modelId: string; initial?: Omit<WatchState, "modelId"> }) {
  const key = `/api/watches?modelId=${encodeURIComponent(modelId)}`;
  const { data, mutate } = useSWR<WatchState>(key, (url: string) => fetch(url).then(readJson), {
    fallbackData: initial ? { modelId, ...initial } : undefined,
  });
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const watching = data?.watching ?? false;

  async function toggle() {
    setBusy(true);
    setError(null);
    try {
      const response = watching
        ? await fetch(key, { method: "DELETE" })
        : await fetch("/api/watches", {
            method: "POST",
            headers: { "content-type": "application/json" },
            body: JSON.stringify({ modelId }),
          });
      await mutate(await readJson(response), { revalidate: false });
    } catch (err) {
      setError(err instanceof Error ? err.message : String(err));
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="inline-flex flex-col items-start gap-1">
      <button
        type="button"
        className={buttonClass(watching ? "secondary" : "primary")}
        aria-pressed={watching}
        disabled={busy || data === undefined}
        onClick={toggle}
      >
        {watching ? "Watching" : "Watch"}
        {data ? <span className="text-xs font-normal opacity-80">({data.watchers})</span> : null}
      </button>
      <span className="text-xs text-ink-soft" aria-live="polite">
        {error ?? (watching ? "You hear of every map certified or retracted at this model." : "")}
      </span>
      <a href="/notifications" className="text-xs text-tide-700 underline">
        Watch a class or a search instead
      </a>
    </div>
  );
}
