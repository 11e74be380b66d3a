import { describeModel, modelsEqual } from "@/lib/models";
import { sealCertificate, type Certificate, type Counterexample } from "@/lib/certificate";
import { DEFAULT_LIMITS, verifyCertificate, type Limits, type VerifyResult } from "@/lib/verify";
import { composePair } from "./composePair";

export type ChainResult =
  | { ok: true; composite: Certificate; verification: "links" | "links+composite" }
  /**
   * `link` is the 0-based index of the failing certificate (or of the one whose target does not meet the next); -1 for the composite.
   * `counterexample` is the checker's, when a square does not commute, for a page to draw; `reason` says it in words.
   */
  | { ok: false; link: number; reason: string; counterexample?: Counterexample };

/**
 * Composes a chain of certificates into one (DOMAIN.md §3) and verifies it two ways: (a) every link
 * verifies and each link's target equals the next link's source exactly; (b) the composite verifies
 * directly whenever that fits the limits. `verification` says whether (b) was done.
 */
export function composeChain(certs: Certificate[], limits: Limits = DEFAULT_LIMITS): ChainResult {
  if (certs.length === 0) return { ok: false, link: 0, reason: "the chain is empty" };
  const verified: Certificate[] = [];
  for (const [i, cert] of certs.entries()) {
    const result = verifyCertificate(cert, limits);
    if (result.status !== "holds") return { ok: false, link: i, reason: `link ${i + 1} does not verify: ${whyNot(result)}`, ...counterexampleOf(result) };
    verified.push(result.certificate);
  }
  let composite = verified[0];
  for (let i = 0; i + 1 < verified.length; i++) {
    const next = verified[i + 1];
    if (!modelsEqual(verified[i].target, next.source))
      return {
        ok: false,
        link: i,
        reason: `link ${i + 1} ends at ${describeModel(verified[i].target)}, but link ${i + 2} starts at ${describeModel(next.source)}`,
      };
    const pasted = composePair(composite, next);
    if (!pasted.ok) return { ok: false, link: i + 1, reason: `link ${i + 2} cannot be pasted onto links 1–${i + 1}: ${pasted.reason}` };
    composite = pasted.certificate;
  }
  composite = sealCertificate(composite);
  if (verified.length === 1) return { ok: true, composite, verification: "links+composite" };
  const direct = verifyCertificate(composite, limits);
  if (direct.status === "too-large") return { ok: true, composite, verification: "links" };
  if (direct.status !== "holds") return { ok: false, link: -1, reason: `the composite does not verify directly: ${whyNot(direct)}`, ...counterexampleOf(direct) };
  return { ok: true, composite, verification: "links+composite" };
}

function whyNot(result: VerifyResult): string {
  switch (result.status) {
    case "fails":
      return `the square does not commute: ${FAILURE_WORDS[result.counterexample.kind]}`;
    case "malformed":
      return result.issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join("; ");
    case "too-large":
      return `${result.bound} is ${result.limit}, the check asks for ${result.asked}`;
    default:
      return "it holds";
  }
}

function counterexampleOf(result: VerifyResult): { counterexample?: Counterexample } {
  return result.status === "fails" ? { counterexample: result.counterexample } : {};
}

/** What each kind of counterexample means, in a clause a person can read (the counterexample itself has the cells and sums). */
const FAILURE_WORDS: Record<Counterexample["kind"], string> = {
  "coarse-rule-mismatch": "for some fine window, the projected centre block after the fine steps differs from what the coarse rule gives",
  "not-a-function": "two fine windows with the same projection end in centre blocks that project differently, so no coarse rule fits",
  "not-lumpable": "two states of one block move into another block with different probabilities",
  "not-exactly-lumpable": "two states of one block receive different totals from another block",
  "lumped-entry-mismatch": "an entry of the claimed lumped matrix is not the common row sum",
  "matrix-entry-mismatch": "an entry of the claimed matrix differs from the exact one",
  "table-entry-mismatch": "an entry of the claimed rule table differs from the recomputed one",
  "label-mismatch": "a state of the target chain carries another label than the map requires",
  "target-mismatch": "the claimed target is not the model the map determines",
};
