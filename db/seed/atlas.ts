import type { Database } from "@/db/client";
import { closeVerificationPool } from "@/server/atlas/pool";
import { submitChain } from "@/server/atlas/submit";
import { createInProcessQueue } from "@/server/jobs/in-process-queue";
import { createJobRunner } from "@/server/jobs/job-runner";
import "@/server/jobs/kinds";
import type { JobView } from "@/server/jobs/queue";
import { seedDemoChains } from "./chains";

/** The ECA atlas of the demo: block sizes 2–3, binary projections and congruences. */
export const DEMO_ECA_ATLAS = { minBlock: 2, maxBlock: 3, search: "both" } as const;

/**
 * The demo atlas: the invented Markov chains with their lumpings, decimations and one chain, then
 * the ECA atlas built through the same job path as a user's job — queued, then run to completion
 * by the same runner in this process. Running it again adds nothing: certificates are idempotent
 * and a finished atlas job is not queued twice.
 */
export async function seedAtlas({
  db,
  workspaceId,
  userId,
  log = console.log,
}: {
  db: Database;
  workspaceId: string;
  userId: string;
  log?: (line: string) => void;
}): Promise<{ chainMaps: number; atlasJob: JobView }> {
  try {
    const chainMaps = await seedDemoChains({ workspaceId, userId });
    const [oneBay, parity] = chainMaps;
    await submitChain({ workspaceId, userId, name: "Twin-bay queue: from the two bays to the parity of busy bays", mapIds: [oneBay.mapId, parity.mapId] });
    log(`demo chains: ${chainMaps.filter((m) => m.status === "created").length} new certified maps of ${chainMaps.length}`);

    const queue = createInProcessQueue({ db, perUserLimit: 100 });
    const earlier = await queue.list({ workspaceId, kind: "eca-atlas", status: "succeeded", limit: 1 });
    if (earlier.items[0]) {
      log("ECA atlas: already built by an earlier seed");
      return { chainMaps: chainMaps.length, atlasJob: earlier.items[0] };
    }
    const job = await queue.enqueue({ workspaceId, ownerId: userId, kind: "eca-atlas", params: DEMO_ECA_ATLAS });
    const runner = createJobRunner({ db, workers: 1 });
    let lastLine = "";
    const ticker = setInterval(() => {
      void queue
        .get({ jobId: job.id, workspaceId })
        .then((now) => {
          const line = now ? `ECA atlas: ${Math.round(now.progress * 100)}% ${now.currentItem ?? ""}` : "";
          if (line && line !== lastLine) log((lastLine = line));
        })
        .catch(() => undefined);
    }, 2000);
    try {
      await runner.drain();
    } finally {
      clearInterval(ticker);
      await runner.stop();
    }
    const finished = (await queue.get({ jobId: job.id, workspaceId }))!;
    if (finished.status !== "succeeded") throw new Error(`the ECA atlas job ended ${finished.status}: ${finished.error}`);
    const result = finished.result as { found: number; certificates: { created: number }; searchRecords: number };
    log(`ECA atlas: ${result.found} coarse-grainings certified (${result.certificates.created} new), ${result.searchRecords} searches recorded`);
    return { chainMaps: chainMaps.length, atlasJob: finished };
  } finally {
    await closeVerificationPool();
  }
}
