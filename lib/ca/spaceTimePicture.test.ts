import { describe, expect, it } from "vitest";
import demoAtlas from "./fixtures/demo-atlas-projections.json";
import { ecaTable, type RuleTable } from "./ruleTable";
import { commutingPicture, projectRow } from "./spaceTimePicture";
import { randomRow } from "./spaceTimeRows";

type DemoModel = { kind: "eca"; rule: number } | { kind: "ca"; k: number; r: number; table: number[] };
type DemoMap = { source: DemoModel; target: DemoModel; block: number; steps: number; projection: number[] };

const tableOf = (m: DemoModel): RuleTable => (m.kind === "eca" ? ecaTable(m.rule) : { k: m.k, r: m.r, table: Uint8Array.from(m.table) });

/** The page's picture: 64 coarse cells × 40 rows (the projected initial row and 39 coarse steps), from a seeded random row. */
function picture(map: DemoMap, projection = map.projection, seed = 2026) {
  const fine = tableOf(map.source);
  return commutingPicture({
    fine,
    coarse: tableOf(map.target),
    block: map.block,
    steps: map.steps,
    projection,
    initial: randomRow({ k: fine.k, width: 64 * map.block, seed }),
    coarseSteps: 39,
  });
}

describe("projectRow", () => {
  it("reads each block with its leftmost cell most significant (DOMAIN.md §1)", () => {
    // blocks 01 | 10 | 11 are states 1, 2, 3; the projection names them 5, 6, 7.
    expect(Array.from(projectRow([0, 1, 1, 0, 1, 1], 2, 2, [4, 5, 6, 7]))).toEqual([5, 6, 7]);
  });

  it("refuses a row that does not split into blocks", () => {
    expect(() => projectRow([0, 1, 1], 2, 2, [0, 1, 1, 0])).toThrow(/blocks of 2/);
  });
});

// fixtures/demo-atlas-projections.json: every certified projection map of the seeded demo atlas
// (`npm run db:seed`, DEMO_ECA_ATLAS: block sizes 2–3), copied from the stored certificates' source,
// target and map fields.
describe("commutingPicture on the demo atlas", () => {
  const maps = demoAtlas as DemoMap[];

  it("holds the certified projection maps of the seeded demo (block sizes 2 and 3)", () => {
    expect(maps.length).toBe(523);
    expect(new Set(maps.map((m) => m.block))).toEqual(new Set([2, 3]));
  });

  it("shows an empty difference on all 64 × 40 coarse cells for every certified CA map", () => {
    for (const map of maps) {
      const p = picture(map);
      expect(p.projected.width).toBe(64);
      expect(p.projected.rows).toBe(40);
      if (p.differing !== 0) throw new Error(`map ${JSON.stringify(map)} differs on ${p.differing} cells`);
    }
  });

  it("shows a non-empty difference for a deliberately wrong projection: 146 onto 128 read on the block 110", () => {
    // Rule 146 onto 128 at block 3 projects "the block is 111" (Israeli & Goldenfeld, PRE 73, 026203, 2006).
    const right: DemoMap = { source: { kind: "eca", rule: 146 }, target: { kind: "eca", rule: 128 }, block: 3, steps: 3, projection: [0, 0, 0, 0, 0, 0, 0, 1] };
    expect(picture(right).differing).toBe(0);
    const wrong = [0, 0, 0, 0, 0, 0, 1, 0];
    const p = picture(right, wrong);
    expect(p.differing).toBeGreaterThan(0);
    let marked = 0;
    for (let i = 0; i < p.difference.cells.length; i++) {
      expect(p.difference.cells[i]).toBe(p.projected.cells[i] === p.coarse.cells[i] ? 0 : 1);
      marked += p.difference.cells[i];
    }
    expect(marked).toBe(p.differing);
  });

  it("shows a non-empty difference when the coarse rule is wrong (90 by parity is 90, not 150)", () => {
    const wrongTarget: DemoMap = { source: { kind: "eca", rule: 90 }, target: { kind: "eca", rule: 150 }, block: 2, steps: 2, projection: [0, 1, 1, 0] };
    expect(picture(wrongTarget).differing).toBeGreaterThan(0);
    expect(picture({ ...wrongTarget, target: { kind: "eca", rule: 90 } }).differing).toBe(0);
  });

  it("starts the coarse CA from the projected initial row, so row 0 never differs", () => {
    const p = picture(maps[0]);
    expect(Array.from(p.coarse.cells.subarray(0, 64))).toEqual(Array.from(p.projected.cells.subarray(0, 64)));
  });
});
