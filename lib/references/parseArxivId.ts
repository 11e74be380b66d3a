/**
 * An arXiv identifier's syntax ("Understanding the arXiv identifier", arXiv documentation):
 * - since April 2007, `YYMM.NNNN` (to December 2014) or `YYMM.NNNNN` (from January 2015), with
 *   an optional version `vN`;
 * - before, `archive(.SUBJECT-CLASS)/YYMMNNN`, e.g. `hep-th/9901001`, `math.GT/0309136`.
 * Accepts a leading "arXiv:". Only the syntax is checked; nothing is fetched.
 */
export function parseArxivId(input: string): string | null {
  const text = input.trim().replace(/^arxiv:\s*/i, "");
  const modern = /^(\d{2})(\d{2})\.(\d{4,5})(v[1-9]\d*)?$/.exec(text);
  if (modern) {
    const [, yy, mm, number] = modern;
    const month = Number(mm);
    if (month < 1 || month > 12) return null;
    const yymm = Number(yy + mm);
    if (yymm < 704) return null;
    const digits = yymm >= 1501 ? 5 : 4;
    return number.length === digits ? text : null;
  }
  const old = /^([a-z]+(?:-[a-z]+)*)(\.[A-Z]{2})?\/(\d{2})(\d{2})(\d{3})(v[1-9]\d*)?$/.exec(text);
  if (old) {
    const month = Number(old[4]);
    return month >= 1 && month <= 12 ? text : null;
  }
  return null;
}
