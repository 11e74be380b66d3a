/**
 * A DOI's syntax (DOI Handbook §2.2): the prefix is the directory indicator "10", a dot and a
 * registrant code (digits, possibly subdivided by further dots); then "/" and a suffix of any
 * printable characters. Case does not matter (§2.4), so the stored form is lower-cased. Accepts the
 * common written forms "doi:…" and "https://doi.org/…". Only the syntax is checked; nothing is resolved.
 */
export function parseDoi(input: string): string | null {
  const text = input.trim().replace(/^(?:doi:\s*|https?:\/\/(?:dx\.)?doi\.org\/)/i, "");
  const match = /^10\.\d+(?:\.\d+)*\/(\S+)$/.exec(text);
  if (!match) return null;
  // Printable ASCII or Unicode; no control characters.
  if ([...match[1]].some((c) => c.charCodeAt(0) < 0x20 || c.charCodeAt(0) === 0x7f)) return null;
  return text.toLowerCase();
}
