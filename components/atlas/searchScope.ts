import type { AskRecord } from "./decideAsk";

/**
 * Could this recorded search have found a map onto a model of `targetKind`? A record may say so
 * itself (`coverage.targetKinds`); otherwise the search kind decides: binary projections of a
 * block-N supercell reach radius-1 binary CAs, i.e. ECAs (DOMAIN §2, R = 1 when T = N); lumping
 * searches reach Markov chains; partition (congruence) searches reach CAs over larger alphabets.
 * A record that says it was not exhaustive (`coverage.exhaustive: false`) proves no "no".
 */
export function targetInScope(record: AskRecord, coverage: Record<string, unknown>, targetKind: string): boolean {
  if (coverage.exhaustive === false) return false;
  const declared = coverage.targetKinds;
  if (Array.isArray(declared)) return declared.includes(targetKind);
  const kind = record.kind.toLowerCase();
  if (kind.includes("projection")) return targetKind === "eca";
  if (kind.includes("lump")) return targetKind === "markov";
  if (kind.includes("partition") || kind.includes("congruence")) return targetKind === "ca" || targetKind === "eca";
  return false;
}
