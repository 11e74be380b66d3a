export type BibtexInput = {
  certificateAddress: string;
  /** e.g. "ECA 146 coarse-grains onto ECA 128 at block size 3". */
  claim: string;
  authorName: string | null;
  workspaceName: string;
  checkerVersion: string;
  verifiedAt: Date;
  url: string;
};

/** Symbols our summaries use that 8-bit LaTeX does not know, spelled in plain LaTeX. */
const SYMBOLS: Record<string, string> = { "→": "{$\\to$}", "·": "{\\textperiodcentered}", "∘": "{$\\circ$}" };

/** BibTeX's special characters, escaped so that names and claims survive LaTeX. */
export function escapeBibtex(text: string): string {
  return text.replace(/[\\{}&%$#_^~→·∘]/g, (c) => {
    if (SYMBOLS[c]) return SYMBOLS[c];
    if (c === "\\") return "\\textbackslash{}";
    if (c === "^") return "\\^{}";
    if (c === "~") return "\\~{}";
    return `\\${c}`;
  });
}

/**
 * A @misc entry that cites a certificate by its content address. The key is derived from the
 * address, so that the same certificate always gets the same key in every paper.
 */
export function bibtexEntry(input: BibtexInput): string {
  const hex = input.certificateAddress.replace(/^sha256:/, "");
  const date = input.verifiedAt.toISOString().slice(0, 10);
  const fields: [string, string][] = [
    ["title", `{Certificate: ${escapeBibtex(input.claim)}}`],
    ["author", `{${escapeBibtex(input.authorName ?? "Squarely atlas")}}`],
    ["howpublished", `{Machine-checked certificate in the Squarely atlas of ${escapeBibtex(input.workspaceName)}}`],
    ["year", `{${date.slice(0, 4)}}`],
    ["note", `{Content address \\texttt{${escapeBibtex(input.certificateAddress)}}; checker ${escapeBibtex(input.checkerVersion)}; verified ${date}}`],
    ["url", `{${input.url}}`],
  ];
  const width = Math.max(...fields.map(([name]) => name.length));
  const body = fields.map(([name, value]) => `  ${name.padEnd(width)} = ${value}`).join(",\n");
  return `@misc{squarely:${hex.slice(0, 12)},\n${body}\n}`;
}
