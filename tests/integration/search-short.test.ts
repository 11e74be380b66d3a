import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { searchAtlas, setDatabase } from "@/db/queries/atlas";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";

/**
 * Terms of one or two letters or digits match the beginning of a word (of a summary, of either
 * end's name, of a model's name), from the word indexes. The expected pages come from a plain
 * JavaScript filter over the rows this test wrote: split into words at anything that is not a
 * letter or digit, compared in lower case.
 */
let t: TestDatabase;
type Row = { id: string; s: number; t: number; summary: string };
const rows: Row[] = [];
const names = new Map<number, string>();
const MODELS = 300;
const MAPS = 5_000;

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  const statements: { sql: string; args: (string | number)[] }[] = [];
  const add = (sql: string, args: (string | number)[] = []) => statements.push({ sql, args });
  for (const ws of ["lab", "elsewhere"]) add("INSERT INTO workspaces (id, slug, name) VALUES (?, ?, ?)", [ws, ws, ws]);
  for (let i = 0; i < MODELS; i++) {
    // A few names that no summary holds (renamed after their maps were written), one with a word inside a word.
    names.set(i, i % 100 === 7 ? `Quokka-relay ${i}` : i === 11 ? "Bandicoot" : `Chain ${i}`);
    add("INSERT INTO models (id, workspace_id, address, kind, name, canonical) VALUES (?, 'lab', ?, 'markov', ?, '{}')", [
      `m${i}`,
      `sha256:${String(i).padStart(64, "0")}`,
      names.get(i)!,
    ]);
  }
  add("INSERT INTO models (id, workspace_id, address, kind, name, canonical) VALUES ('x0', 'elsewhere', 'sha256:x', 'markov', 'Quokka far away', '{}')");
  add("INSERT INTO models (id, workspace_id, address, kind, name, description, canonical) VALUES ('d0', 'lab', 'sha256:d', 'markov', 'Dingo', 'kept beside the qx pen', '{}')");
  for (let i = 0; i < MAPS; i++) {
    const [s, tt] = [(i * 7) % MODELS, (i * 13 + 1) % MODELS];
    const row = { id: `e${String(i).padStart(5, "0")}`, s, t: tt, summary: `Chain ${s} → Chain ${tt}${i % 1000 === 3 ? " (Zq)" : ""}` };
    rows.push(row);
    add("INSERT INTO certificates (address, kind, format_version, body, checker_version, verified_at) VALUES (?, 'lumping', 1, '{}', 't', 0)", [`sha256:c${i}`]);
    add("INSERT INTO maps (id, workspace_id, source_model_id, target_model_id, kind, summary, certificate_address) VALUES (?, 'lab', ?, ?, 'lumping', ?, ?)", [
      row.id,
      `m${s}`,
      `m${tt}`,
      row.summary,
      `sha256:c${i}`,
    ]);
  }
  add("INSERT INTO certificates (address, kind, format_version, body, checker_version, verified_at) VALUES ('sha256:cx', 'lumping', 1, '{}', 't', 0)");
  add("INSERT INTO maps (id, workspace_id, source_model_id, target_model_id, kind, summary, certificate_address) VALUES ('e-other', 'elsewhere', 'x0', 'x0', 'lumping', 'Qu Qu', 'sha256:cx')");
  await t.db.$client.batch(statements, "write");
}, 120_000);

afterAll(() => {
  setDatabase(null);
  t.cleanup();
});

const startsAWord = (text: string, q: string) => text.toLowerCase().split(/[^\p{L}\p{N}]+/u).some((w) => w.startsWith(q.toLowerCase()));

function expectedMaps(q: string, limit: number): string[] {
  return rows
    .filter((r) => startsAWord(r.summary, q) || startsAWord(names.get(r.s)!, q) || startsAWord(names.get(r.t)!, q))
    .map((r) => r.id)
    .sort()
    .slice(0, limit);
}

async function mapsPage(q: string, limit: number) {
  return (await searchAtlas({ workspaceId: "lab", target: "maps", q, limit })).items.map((m) => m.id);
}

describe("searching with a term of one or two characters", () => {
  // Up to 4,000 matching maps ("qu", "7", "5") come from the word index's list of candidates; more
  // ("C", "ch": every summary) from the walk in map order.
  it.each(["qu", "Q", "zq", "ba", "C", "ch", "7", "29", "5", "xy"])("lists the maps with a word beginning with %j, as a plain filter does", async (q) => {
    expect(await mapsPage(q, 60)).toEqual(expectedMaps(q, 60));
  });

  it("matches the beginning of a word only: 'ha' finds no Chain, 'an' finds no Bandicoot", async () => {
    expect(await mapsPage("ha", 10)).toEqual([]);
    expect(expectedMaps("an", 10)).toEqual([]);
    expect(await mapsPage("an", 10)).toEqual([]);
  });

  it("pages through a common short term without gaps or repeats", async () => {
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const page: Awaited<ReturnType<typeof searchAtlas>> = await searchAtlas({ workspaceId: "lab", target: "maps", q: "ch", limit: 700, cursor });
      seen.push(...page.items.map((m) => m.id));
      cursor = page.nextCursor;
    } while (cursor);
    expect(seen).toEqual(expectedMaps("ch", MAPS));
    expect(seen).toHaveLength(MAPS);
  });

  it("lists models by a word of their name, or by their description as before", async () => {
    const models = async (q: string) => {
      const page = await searchAtlas({ workspaceId: "lab", target: "models", q, limit: 500 });
      return page.target === "models" ? page.items.map((m) => m.name).sort() : [];
    };
    const byName = (q: string) => [...names.values(), "Dingo"].filter((n) => startsAWord(n, q)).sort();
    expect(await models("qu")).toEqual(byName("qu"));
    expect(await models("re")).toEqual(["Quokka-relay 107", "Quokka-relay 207", "Quokka-relay 7"]);
    expect(await models("qx")).toEqual(["Dingo"]);
    expect(await models("9")).toEqual(byName("9"));
  });

  it("keeps a term of one or two other characters (not a letter or digit) as a plain part-of-text match", async () => {
    expect(await mapsPage("(Z", 10)).toEqual(rows.filter((r) => r.summary.includes("(Z")).map((r) => r.id).sort());
  });
});
