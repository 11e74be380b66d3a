import { parseArxivId } from "./parseArxivId";
import { parseDoi } from "./parseDoi";

export type Reference = { scheme: "doi"; id: string } | { scheme: "arxiv"; id: string };

/** A "published in" reference: a DOI or an arXiv identifier, normalised; null when it is neither. */
export function parseReference(input: string): Reference | null {
  const doi = parseDoi(input);
  if (doi) return { scheme: "doi", id: doi };
  const arxiv = parseArxivId(input);
  if (arxiv) return { scheme: "arxiv", id: arxiv };
  return null;
}

/** Where a reader resolves the reference (the link is shown, never fetched by the server). */
export function referenceUrl(ref: Reference): string {
  return ref.scheme === "doi" ? `https://doi.org/${ref.id}` : `https://arxiv.org/abs/${ref.id}`;
}
