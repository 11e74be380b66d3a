import { describeModel, modelsEqual } from "@/lib/models";
import { sealCertificate, type Certificate } from "@/lib/certificate";
import { DEFAULT_LIMITS, verifyCertificate, type Limits, type VerifyResult } from "@/lib/verify";
import { composePair } from "./composePair";

export type ChainResult =
  | { ok: true; composite: Certificate; verification: "links" | "links+composite" }
  /** `link` is the 0-based index of the failing certificate (or of the one whose target does not meet the next); -1 for the composite. */
  | { ok: false; link: number; reason: string };

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
    if (result.status !== "holds") return { ok: false, link: i, reason: `link ${i + 1} does not verify: ${whyNot(result)}` };
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
  if (direct.status !== "holds") return { ok: false, link: -1, reason: `the composite does not verify directly: ${whyNot(direct)}` };
  return { ok: true, composite, verification: "links+composite" };
}

function whyNot(result: VerifyResult): string {
  switch (result.status) {
    case "fails":
      return `the square does not commute (${result.counterexample.kind})`;
    case "malformed":
      return result.issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join("; ");
    case "too-large":
      return `${result.bound} is ${result.limit}, the check asks for ${result.asked}`;
    default:
      return "it holds";
  }
}
