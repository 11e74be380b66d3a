import { describe, expect, it } from "vitest";
import { totalisticTable, TOTALISTIC_CODES } from "@/lib/discovery";
import { totalisticCode } from "./index";

/**
 * Worked by hand: the sum values v(0..6) = (0, 1, 2, 1, 0, 2, 1) give c = 1·3 + 2·9 + 1·27 + 0·81 + 2·243 + 1·729 = 1263.
 * Its table (index 9·x₋₁ + 3·x₀ + x₁, DOMAIN.md §1), neighbourhood → sum → new value:
 *   000 0→0  001 1→1  002 2→2   010 1→1  011 2→2  012 3→1   020 2→2  021 3→1  022 4→0
 *   100 1→1  101 2→2  102 3→1   110 2→2  111 3→1  112 4→0   120 3→1  121 4→0  122 5→2
 *   200 2→2  201 3→1  202 4→0   210 3→1  211 4→0  212 5→2   220 4→0  221 5→2  222 6→1
 */
const CODE_1263 = [..."012121210121210102210102021"].map(Number);

describe("totalisticCode (three states, radius 1; DOMAIN.md §2b)", () => {
  it("numbers a hand-worked totalistic table by the base-3 digits of its sum values", () => {
    expect(totalisticCode({ k: 3, r: 1, table: CODE_1263 })).toBe(1263);
  });

  it("gives the ends of the numbering: all zeros is 0, all twos is 3^7 − 1 = 2186", () => {
    expect(totalisticCode({ k: 3, r: 1, table: new Array(27).fill(0) })).toBe(0);
    expect(totalisticCode({ k: 3, r: 1, table: new Array(27).fill(2) })).toBe(2186);
  });

  it("returns null when two neighbourhoods with the same sum disagree (001 → 0 but 010 → 1, both sum 1)", () => {
    const table = CODE_1263.slice();
    table[1] = 0;
    expect(totalisticCode({ k: 3, r: 1, table })).toBeNull();
    expect(CODE_1263[1]).toBe(1);
  });

  it("returns null for other alphabets and radii", () => {
    expect(totalisticCode({ k: 2, r: 1, table: new Array(8).fill(0) })).toBeNull();
    expect(totalisticCode({ k: 3, r: 2, table: new Array(243).fill(0) })).toBeNull();
  });

  it("inverts the atlas's own code → table map (written separately, in lib/discovery) for all 2,187 codes", () => {
    for (let c = 0; c < TOTALISTIC_CODES; c++) expect(totalisticCode(totalisticTable(c))).toBe(c);
  });
});
