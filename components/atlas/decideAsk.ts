/** A recorded exhaustive search, as stored (coverage and outcome are JSON text). */
export type AskRecord = {
  id: string;
  kind: string;
  maxBlock: number | null;
  algorithm: string;
  algorithmVersion: string;
  coverage: string;
  outcome: string;
  /** How many targets the search reached. */
  found: number;
  createdAt: Date;
};

export type AskAnswer =
  | { answer: "yes"; reason: "same-model" }
  | { answer: "yes"; reason: "chain"; mapIds: string[]; otherChains: number }
  | { answer: "no"; record: AskRecord; coverage: Record<string, unknown>; maxBlock: number | null }
  | { answer: "unknown"; reason: "no-search" | "target-outside-search"; searched: number };

function parseObject(text: string): Record<string, unknown> | null {
  try {
    const value: unknown = JSON.parse(text);
    return value && typeof value === "object" && !Array.isArray(value) ? (value as Record<string, unknown>) : null;
  } catch {
    return null;
  }
}

/**
 * "Does A coarse-grain onto B?" in one of three answers, saying which:
 *   yes     — a chain of certified maps leads from A to B (each square commutes, so the outer one does);
 *   no      — a recorded exhaustive search from A, whose bounds B falls within, reached every target
 *             it could and B is not among them (`outcome.targets`, content addresses);
 *   unknown — neither: nothing in the atlas covers the question yet.
 * `targetInScope` decides whether B is a model a given search could have found (e.g. a binary
 * projection search only reaches binary CAs); without it no search can prove a "no".
 */
export function decideAsk(input: {
  sameModel: boolean;
  paths: { mapIds: string[] }[];
  records: AskRecord[];
  targetAddress: string;
  targetInScope: (record: AskRecord, coverage: Record<string, unknown>) => boolean;
}): AskAnswer {
  if (input.sameModel) return { answer: "yes", reason: "same-model" };
  const [shortest, ...rest] = input.paths;
  if (shortest) return { answer: "yes", reason: "chain", mapIds: shortest.mapIds, otherChains: rest.length };

  const covering = input.records
    .map((record) => ({ record, coverage: parseObject(record.coverage), outcome: parseObject(record.outcome) }))
    .filter(({ coverage, outcome }) => coverage !== null && outcome !== null && Array.isArray(outcome.targets))
    .filter(({ record, coverage }) => input.targetInScope(record, coverage!))
    .filter(({ outcome }) => !(outcome!.targets as unknown[]).includes(input.targetAddress))
    .sort((a, b) => (b.record.maxBlock ?? 0) - (a.record.maxBlock ?? 0));

  const best = covering[0];
  if (best) return { answer: "no", record: best.record, coverage: best.coverage!, maxBlock: best.record.maxBlock };
  return {
    answer: "unknown",
    reason: input.records.length === 0 ? "no-search" : "target-outside-search",
    searched: input.records.length,
  };
}
