/** The longest state label a chain may have (lib/models/schema.ts). */
const MAX_LABEL = 200;

/**
 * The label of block `b` of a lumping: its states' labels as a set, "{R,S}". When that would be
 * longer than a label may be, it is cut and marked with the block's number and size, "#1 {R,S,…} (40
 * states)", which stays within the bound and distinct from every other block's label.
 */
export function blockLabel(labels: readonly string[], b: number): string {
  const full = `{${labels.join(",")}}`;
  if (full.length <= MAX_LABEL) return full;
  const tail = `…} (${labels.length} states)`;
  const head = `#${b} {`;
  return head + labels.join(",").slice(0, MAX_LABEL - head.length - tail.length) + tail;
}
