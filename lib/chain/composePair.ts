import { toDigits } from "@/lib/ca";
import { canonicalPartition } from "@/lib/markov";
import { caShape } from "@/lib/models";
import { CERTIFICATE_FORMAT, CERTIFICATE_VERSION, type Certificate, type CertificateMap } from "@/lib/certificate";

export type Composed = { ok: true; certificate: Certificate } | { ok: false; reason: string };

/**
 * The single certificate for `first` followed by `second` (first.target = second.source), by the pasting
 * rules of DOMAIN.md §3: blocks and steps multiply, projections and partitions compose, and a decimation
 * followed or preceded by a lumping is the lumping of the decimated chain (lumping commutes with decimation).
 */
export function composePair(first: Certificate, second: Certificate): Composed {
  const map = composeMaps(first, second);
  if (typeof map === "string") return { ok: false, reason: map };
  return { ok: true, certificate: { format: CERTIFICATE_FORMAT, version: CERTIFICATE_VERSION, map, source: first.source, target: second.target } };
}

function composeMaps(first: Certificate, second: Certificate): CertificateMap | string {
  const a = first.map;
  const b = second.map;
  if ((a.kind === "lumping" || a.kind === "decimation") && (b.kind === "lumping" || b.kind === "decimation")) {
    const pa = a.kind === "lumping" ? a.partition : null;
    const pb = b.kind === "lumping" ? b.partition : null;
    const steps = a.steps * b.steps;
    if (pa === null && pb === null) return { kind: "decimation", steps };
    const n = pa?.length ?? pb!.length;
    const partition = canonicalPartition(Array.from({ length: n }, (_, i) => (pb === null ? pa![i] : pa === null ? pb[i] : pb[pa[i]])));
    return { kind: "lumping", partition, steps };
  }
  if (a.kind === "iterate" && b.kind === "iterate") return { kind: "iterate", steps: a.steps * b.steps };
  if (a.kind === "projection" && b.kind === "projection") return sameRadius(first, second, composeProjections(first, a, b));
  if (a.kind === "iterate" && b.kind === "projection") return sameRadius(first, second, { ...b, steps: a.steps * b.steps });
  if (a.kind === "projection" && b.kind === "iterate") return sameRadius(first, second, { ...a, steps: a.steps * b.steps });
  return `no single map composes a ${a.kind} followed by a ${b.kind}`;
}

/** s(X_1 … X_M) = q(p(X_1), …, p(X_M)) on a block of N·M cells split into M sub-blocks of N (DOMAIN.md §3). */
function composeProjections(first: Certificate, a: Extract<CertificateMap, { kind: "projection" }>, b: Extract<CertificateMap, { kind: "projection" }>): CertificateMap | string {
  const { k } = caShape(first.source);
  const K = k ** a.block;
  const m = Math.max(...a.projection) + 1;
  const size = k ** (a.block * b.block);
  if (size > 256) return `the composite block of ${a.block * b.block} cells has ${size} states, more than 256`;
  const projection = Array.from({ length: size }, (_, s) => {
    let coarse = 0;
    for (const x of toDigits(s, K, b.block)) coarse = coarse * m + a.projection[x];
    return b.projection[coarse];
  });
  return { kind: "projection", block: a.block * b.block, steps: a.steps * b.steps, projection };
}

/** The composite coarse CA has radius ceil(rT/N); paste only when that is the radius the chain ends with. */
function sameRadius(first: Certificate, second: Certificate, map: CertificateMap | string): CertificateMap | string {
  if (typeof map === "string" || map.kind !== "projection") return map;
  const R = Math.ceil((caShape(first.source).r * map.steps) / map.block);
  const end = caShape(second.target).r;
  return R === end ? map : `the composite coarse rule would have radius ${R}, but the chain ends with radius ${end}`;
}
