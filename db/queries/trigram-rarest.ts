import "server-only";
import { sql } from "drizzle-orm";
import type { Executor } from "./connection";

/**
 * A phrase query for the rarest trigram of a search term in the maps' trigram index, so that the
 * index reads one short doclist instead of all of the term's (FTS5 reads every doclist of a phrase
 * or a LIKE in full, and in a large atlas a word such as "Chain" is in every summary: 10–16 ms a
 * search). Any trigram of the term gives a superset of the rows that contain it, so the caller still
 * tests the LIKE on the row; the counts only choose which trigram, and stale counts cost speed, never
 * a result. The counts come from fts5vocab (SQLite FTS5 documentation, "The fts5vocab Virtual Table
 * Module"), re-read at most every ten minutes per process (one scan, ~90 ms for 100,000 maps).
 */
const STATS_MS = 10 * 60_000;
let stats: { at: number; docs: Promise<Map<string, number>> } | null = null;

function readStats(db: Executor): Promise<Map<string, number>> {
  return (async () => {
    await db.run(sql.raw("CREATE VIRTUAL TABLE IF NOT EXISTS temp.maps_trigrams_vocab USING fts5vocab(main, maps_trigrams, row)"));
    const rows = await db.all<{ term: string; doc: number }>(sql.raw("SELECT term, doc FROM temp.maps_trigrams_vocab"));
    return new Map(rows.map((r) => [r.term, Number(r.doc)]));
  })();
}

async function trigramCounts(db: Executor): Promise<Map<string, number>> {
  if (!stats || Date.now() - stats.at > STATS_MS) {
    const docs = readStats(db);
    stats = { at: Date.now(), docs };
    docs.catch(() => (stats = null));
  }
  return stats.docs;
}

/**
 * The term's three-character windows as written: the tokenizer folds the phrase as it folded the
 * rows (so the phrase matches whatever the LIKE would); the counts are looked up lower-cased.
 */
function windowsOf(term: string): string[] {
  const chars = [...term];
  return Array.from({ length: chars.length - 2 }, (_, i) => chars.slice(i, i + 3).join(""));
}

/** `"abc"`: an FTS5 string holding the term's least common trigram (quotes doubled, FTS5 query syntax). */
export async function rarestTrigramPhrase(db: Executor, term: string): Promise<string> {
  // Without counts any window still answers correctly, only more slowly.
  const counts = await trigramCounts(db).catch(() => new Map<string, number>());
  const count = (w: string) => counts.get(w.toLowerCase()) ?? 0;
  const [rarest] = windowsOf(term).sort((a, b) => count(a) - count(b));
  return `"${rarest.replaceAll('"', '""')}"`;
}

/** Tests: read the counts again at the next search. */
export function forgetTrigramCounts(): void {
  stats = null;
}
