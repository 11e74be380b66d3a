import { describe, expect, it } from "vitest";
import { bibtexEntry, escapeBibtex } from "./bibtexEntry";

const input = {
  certificateAddress: "sha256:0123456789abcdef0123",
  claim: "ECA 146 coarse-grains onto ECA 128 at block size 3",
  authorName: "Ada Quill",
  workspaceName: "Lattice & Flow group",
  checkerVersion: "1.0.0",
  verifiedAt: new Date("2026-12-02T10:00:00Z"),
  url: "http://localhost:3000/atlas/maps/m1",
};

describe("bibtexEntry", () => {
  it("keys the entry by the certificate's address so that the same certificate always gets the same key", () => {
    expect(bibtexEntry(input)).toMatch(/^@misc\{squarely:0123456789ab,\n/);
    expect(bibtexEntry({ ...input, authorName: "Someone Else" })).toMatch(/^@misc\{squarely:0123456789ab,/);
  });

  it("carries the claim, the address, the checker version and the verification date", () => {
    const entry = bibtexEntry(input);
    expect(entry).toContain("title        = {Certificate: ECA 146 coarse-grains onto ECA 128 at block size 3}");
    expect(entry).toContain("\\texttt{sha256:0123456789abcdef0123}");
    expect(entry).toContain("checker 1.0.0; verified 2026-12-02");
    expect(entry).toContain("year         = {2026}");
    expect(entry).toContain("url          = {http://localhost:3000/atlas/maps/m1}");
    expect(entry.endsWith("\n}")).toBe(true);
  });

  it("escapes LaTeX's special characters in free text", () => {
    expect(bibtexEntry(input)).toContain("Lattice \\& Flow group");
    expect(escapeBibtex("50% of {a}_b #1 $x$")).toBe("50\\% of \\{a\\}\\_b \\#1 \\$x\\$");
  });

  it("spells the arrow and the middle dot of our summaries in plain LaTeX", () => {
    expect(escapeBibtex("ECA 146 → ECA 128 · block 3")).toBe("ECA 146 {$\\to$} ECA 128 {\\textperiodcentered} block 3");
  });

  it("falls back to the atlas as author when the author's account is gone", () => {
    expect(bibtexEntry({ ...input, authorName: null })).toContain("author       = {Squarely atlas}");
  });
});
