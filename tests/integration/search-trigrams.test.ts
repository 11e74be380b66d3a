import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { searchAtlas, setDatabase } from "@/db/queries/atlas";
import { forgetTrigramCounts } from "@/db/queries/trigram-rarest";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";

/**
 * The maps search answers "part of a name or summary" from trigram indexes when it can; these
 * compare its pages with a plain JavaScript filter over the rows the test wrote itself.
 */
let t: TestDatabase;
type Row = { id: string; ws: string; s: number; t: number; summary: string };
const rows: Row[] = [];
const names = new Map<number, string>();

beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  const statements: { sql: string; args: (string | number)[] }[] = [];
  // One write transaction for all rows (a commit per row is slow on a busy disk).
  const c = { execute: async (s: string | { sql: string; args?: (string | number)[] }) => void statements.push(typeof s === "string" ? { sql: s, args: [] } : { sql: s.sql, args: s.args ?? [] }) };
  for (const ws of ["lab", "elsewhere"]) await c.execute({ sql: "INSERT INTO workspaces (id, slug, name) VALUES (?, ?, ?)", args: [ws, ws, ws] });
  for (let i = 0; i < 60; i++) {
    // Model 7's name is not in any summary: it was renamed after its maps were written.
    names.set(i, i === 7 ? "Quokka relay" : `Chain ${i}`);
    await c.execute({
      sql: "INSERT INTO models (id, workspace_id, address, kind, name, canonical) VALUES (?, 'lab', ?, 'markov', ?, '{}')",
      args: [`m${i}`, `sha256:${String(i).padStart(64, "0")}`, names.get(i)!],
    });
  }
  await c.execute({ sql: "INSERT INTO models (id, workspace_id, address, kind, name, canonical) VALUES ('x0', 'elsewhere', 'sha256:x', 'markov', 'Chain 5', '{}')" });
  await c.execute({ sql: "INSERT INTO models (id, workspace_id, address, kind, name, description, canonical) VALUES ('d0', 'lab', 'sha256:d', 'markov', 'Dingo', 'seen near Chain 13 and a Quokka', '{}')" });
  for (let i = 0; i < 300; i++) {
    const [s, tt] = [(i * 7) % 60, (i * 13 + 1) % 60];
    const row = { id: `e${String(i).padStart(4, "0")}`, ws: "lab", s, t: tt, summary: `Chain ${s} → Chain ${tt}${i % 50 === 0 ? " (50% done)" : ""}` };
    rows.push(row);
    await c.execute({ sql: "INSERT INTO certificates (address, kind, format_version, body, checker_version, verified_at) VALUES (?, 'lumping', 1, '{}', 't', 0)", args: [`sha256:c${i}`] });
    await c.execute({
      sql: "INSERT INTO maps (id, workspace_id, source_model_id, target_model_id, kind, summary, certificate_address) VALUES (?, 'lab', ?, ?, 'lumping', ?, ?)",
      args: [row.id, `m${s}`, `m${tt}`, row.summary, `sha256:c${i}`],
    });
  }
  await c.execute("INSERT INTO certificates (address, kind, format_version, body, checker_version, verified_at) VALUES ('sha256:cx', 'lumping', 1, '{}', 't', 0)");
  await c.execute("INSERT INTO maps (id, workspace_id, source_model_id, target_model_id, kind, summary, certificate_address) VALUES ('e-other', 'elsewhere', 'x0', 'x0', 'lumping', 'Chain 5 → Chain 5', 'sha256:cx')");
  await t.db.$client.batch(statements, "write");
}, 60_000);

afterAll(() => {
  setDatabase(null);
  t.cleanup();
});

/** What the search should list: the lab's maps whose summary or either end's name contains q (any case), by id. */
function expected(q: string, limit: number): string[] {
  const has = (text: string) => text.toLowerCase().includes(q.toLowerCase());
  return rows
    .filter((r) => has(r.summary) || has(names.get(r.s)!) || has(names.get(r.t)!))
    .map((r) => r.id)
    .sort()
    .slice(0, limit);
}

async function search(q: string, limit = 20) {
  const page = await searchAtlas({ workspaceId: "lab", target: "maps", q, limit });
  return page.items.map((m) => m.id);
}

describe("searching maps by part of a name or summary", () => {
  it.each(["Chain 13", "chain 5 →", "→ Chain 59", "Quokka", "quokka rel", "Chain", "(50% done)", "50", "%", "no such text"])(
    "lists the same maps as a plain filter for %j",
    async (q) => {
      expect(await search(q)).toEqual(expected(q, 20));
    },
  );

  it("finds maps by either end's current name, not only by the summary written then", async () => {
    const found = await search("Quokka relay", 100);
    expect(found.length).toBeGreaterThan(0);
    expect(found).toEqual(expected("Quokka relay", 100));
    expect(rows.filter((r) => found.includes(r.id)).every((r) => r.s === 7 || r.t === 7)).toBe(true);
  });

  it("follows a rename through the index", async () => {
    await t.db.$client.execute("UPDATE models SET name = 'Wombat junction' WHERE id = 'm7'");
    names.set(7, "Wombat junction");
    expect(await search("Quokka")).toEqual([]);
    expect(await search("Wombat junc", 100)).toEqual(expected("Wombat junc", 100));
  });

  it("lists the same maps when the trigram counts predate the rows (they choose the trigram, never the result)", async () => {
    forgetTrigramCounts();
    expect(await search("Chain 13")).toEqual(expected("Chain 13", 20));
    // Written after the counts were read: its trigrams are unknown to them.
    const row = { id: "e9999", ws: "lab", s: 1, t: 2, summary: 'Kiwi "loop" from Chain 1 → Chain 2' };
    rows.push(row);
    await t.db.$client.execute("INSERT INTO certificates (address, kind, format_version, body, checker_version, verified_at) VALUES ('sha256:ck', 'lumping', 1, '{}', 't', 0)");
    await t.db.$client.execute({
      sql: "INSERT INTO maps (id, workspace_id, source_model_id, target_model_id, kind, summary, certificate_address) VALUES (?, 'lab', 'm1', 'm2', 'lumping', ?, 'sha256:ck')",
      args: [row.id, row.summary],
    });
    for (const q of ['kiwi "LOOP"', '"loop" from Chain 1', "Chain 1 → Chain 2"]) expect(await search(q, 100)).toEqual(expected(q, 100));
    expect(await search('kiwi "LOOP"', 100)).toEqual(["e9999"]);
  });

  it("pages with a cursor through the same list", async () => {
    const first = await searchAtlas({ workspaceId: "lab", target: "maps", q: "Chain 1", limit: 5 });
    const second = await searchAtlas({ workspaceId: "lab", target: "maps", q: "Chain 1", limit: 5, cursor: first.nextCursor });
    expect([...first.items, ...second.items].map((m) => m.id)).toEqual(expected("Chain 1", 10));
  });
});

describe("searching models by part of a name or description", () => {
  /** The lab's models whose name or description contains q (any case), by name then id. */
  function expectedModels(q: string): string[] {
    const all = [...names.entries()].map(([i, name]) => ({ id: `m${i}`, name, description: "" }));
    all.push({ id: "d0", name: "Dingo", description: "seen near Chain 13 and a Quokka" });
    const has = (text: string) => text.toLowerCase().includes(q.toLowerCase());
    return all
      .filter((m) => has(m.name) || has(m.description))
      .sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : a.id < b.id ? -1 : 1))
      .map((m) => m.id)
      .slice(0, 50);
  }

  // Terms of one or two letters or digits match the start of a word instead: search-short.test.ts.
  it.each(["Chain 13", "chain 4", "Wombat", "Quokka", "Dingo", "ain", "%", "no such text"])("lists the same models as a plain filter for %j", async (q) => {
    const page = await searchAtlas({ workspaceId: "lab", target: "models", q, limit: 50 });
    expect(page.items.map((m) => m.id)).toEqual(expectedModels(q));
  });
});
