import { CERTIFICATE_FORMAT, CERTIFICATE_VERSION, type CertificateMap } from "@/lib/certificate";
import { canonicalModel, type Model } from "@/lib/models";
import { exceededLimit, type Limits } from "./limits";
import { rawInputRefusal } from "./rawInputRefusal";
import { tooLarge, type Refusal } from "./refusal";

type Request = { kind?: unknown; chain?: unknown; rule?: unknown; table?: unknown; block?: unknown; steps?: unknown; partition?: unknown };

/**
 * The bounds of a build request (what lib/certificate's certify* builders are given), checked before
 * the builder computes anything: first the raw ones, then the sizes and predicted cost of the check the
 * builder would run (a decimation's P^steps, a projection's windows), as the verifier would check them.
 * Returns null when the request is within the limits or too broken to size (the builder then says what is wrong).
 */
export function buildRequestRefusal(request: unknown, limits: Limits): Refusal | null {
  const raw = rawInputRefusal(request, limits);
  if (raw || typeof request !== "object" || request === null) return raw;
  const r = request as Request;
  let source: Model;
  try {
    source = canonicalModel(r.kind === "lumping" || r.kind === "decimation" ? r.chain : r.rule !== undefined ? { kind: "eca", rule: r.rule } : { kind: "ca", ...(r.table as object) });
  } catch {
    return null;
  }
  const map = sizingMap(r);
  if (!map) return null;
  const exceeded = exceededLimit({ format: CERTIFICATE_FORMAT, version: CERTIFICATE_VERSION, map, source, target: source }, limits);
  return exceeded ? tooLarge(exceeded.bound, exceeded.limit, exceeded.asked) : null;
}

const whole = (x: unknown): x is number => Number.isSafeInteger(x) && (x as number) >= 1;

function sizingMap(r: Request): CertificateMap | null {
  const block = whole(r.block) ? r.block : null;
  const steps = whole(r.steps) ? r.steps : r.steps === undefined ? (block ?? 1) : null;
  if (steps === null) return null;
  switch (r.kind) {
    case "lumping":
      return { kind: "lumping", partition: [], steps };
    case "decimation":
      return { kind: "decimation", steps };
    case "iterate":
      return { kind: "iterate", steps };
    case "projection":
    case "blocking":
      return block === null ? null : r.kind === "projection" ? { kind: "projection", block, steps, projection: [] } : { kind: "blocking", block, steps };
    default:
      return null;
  }
}
