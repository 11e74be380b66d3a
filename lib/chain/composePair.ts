import { fromDigits, toDigits, type RuleTable } from "@/lib/ca";
import { canonicalPartition } from "@/lib/markov";
import { caShape, canonicalModel, chainSize, modelMatrix, modelRuleTable, ruleTableModel, type Model } from "@/lib/models";
import { formatRational } from "@/lib/rational";
import { CERTIFICATE_FORMAT, CERTIFICATE_VERSION, blockLabels, chainLabels, type Certificate, type CertificateMap } from "@/lib/certificate";

export type Composed = { ok: true; certificate: Certificate } | { ok: false; reason: string };

type Projection = Extract<CertificateMap, { kind: "projection" }>;

/**
 * The single certificate for `first` followed by `second` (first.target = second.source), by the pasting
 * rules of lib/certificate/FORMAT.md ("Pasting"), each with its proof there. The composite's target is
 * the chain's last model written in the encoding the composite map produces: a CA narrowed to the
 * composite radius ceil(rT/N), a lumped chain relabelled by its blocks in the source's labels.
 */
export function composePair(first: Certificate, second: Certificate): Composed {
  const map = composeMaps(first, second);
  if (typeof map === "string") return { ok: false, reason: map };
  const target = compositeTarget(map, first.source, second.target);
  if (typeof target === "string") return { ok: false, reason: target };
  return { ok: true, certificate: { format: CERTIFICATE_FORMAT, version: CERTIFICATE_VERSION, map, source: first.source, target } };
}

function composeMaps(first: Certificate, second: Certificate): CertificateMap | string {
  const a = first.map;
  const b = second.map;
  if ((a.kind === "lumping" || a.kind === "decimation") && (b.kind === "lumping" || b.kind === "decimation")) return composeChainMaps(a, b, chainSize(first.source));
  if (a.kind === "lumping" || a.kind === "decimation" || b.kind === "lumping" || b.kind === "decimation") return `no single map composes a ${a.kind} followed by a ${b.kind}`;
  const steps = a.steps * b.steps;
  switch (`${a.kind}+${b.kind}`) {
    case "iterate+iterate":
      return { kind: "iterate", steps };
    case "iterate+blocking":
    case "blocking+iterate":
      return { kind: "blocking", block: a.kind === "blocking" ? a.block : (b as { block: number }).block, steps };
    case "blocking+blocking":
      return { kind: "blocking", block: (a as { block: number }).block * (b as { block: number }).block, steps };
    case "iterate+projection":
      return { ...(b as Projection), steps };
    case "projection+iterate":
      return { ...(a as Projection), steps };
    case "blocking+projection":
      // A block of M supercell symbols of N cells each is, as an integer, the block of N·M cells (c_0 most significant).
      return { ...(b as Projection), block: (a as { block: number }).block * (b as Projection).block, steps };
    case "projection+blocking":
      return projectionThenBlocking(first, a as Projection, (b as { block: number }).block, steps);
    default:
      return composeProjections(first, a as Projection, b as Projection);
  }
}

/** Lumpings and decimations: steps multiply; partitions compose (σ∘π); a decimation keeps the partition. */
function composeChainMaps(a: Extract<CertificateMap, { kind: "lumping" | "decimation" }>, b: Extract<CertificateMap, { kind: "lumping" | "decimation" }>, n: number): CertificateMap {
  const pa = a.kind === "lumping" ? a.partition : null;
  const pb = b.kind === "lumping" ? b.partition : null;
  const steps = a.steps * b.steps;
  if (pa === null && pb === null) return { kind: "decimation", steps };
  const partition = canonicalPartition(Array.from({ length: n }, (_, i) => (pb === null ? pa![i] : pa === null ? pb[i] : pb[pa[i]])));
  return { kind: "lumping", partition, steps };
}

/** s(X_1 … X_M) = q(p(X_1), …, p(X_M)) on a block of N·M cells split into M sub-blocks of N, X_1 leftmost (FORMAT.md). */
function composeProjections(first: Certificate, a: Projection, b: Projection): CertificateMap | string {
  const { k } = caShape(first.source);
  const K = k ** a.block;
  const m = Math.max(...a.projection) + 1;
  const size = k ** (a.block * b.block);
  if (size > 256) return `the composite block of ${a.block * b.block} cells has ${size} states, more than 256`;
  const projection = Array.from({ length: size }, (_, s) => b.projection[fromDigits(Array.from(toDigits(s, K, b.block), (x) => a.projection[x]), m)]);
  return { kind: "projection", block: a.block * b.block, steps: a.steps * b.steps, projection };
}

/** p then blocking by M: the block of N·M cells goes to the supercell symbol (p(X_1), …, p(X_M)) read base m. */
function projectionThenBlocking(first: Certificate, a: Projection, M: number, steps: number): CertificateMap | string {
  const { k } = caShape(first.source);
  const K = k ** a.block;
  const m = Math.max(...a.projection) + 1;
  const size = K ** M;
  if (size > 256) return `the composite block of ${a.block * M} cells has ${size} states, more than 256`;
  const projection = Array.from({ length: size }, (_, s) => fromDigits(Array.from(toDigits(s, K, M), (x) => a.projection[x]), m));
  return { kind: "projection", block: a.block * M, steps, projection };
}

/** The chain's last model in the encoding the composite map produces (FORMAT.md, "Pasting"). */
function compositeTarget(map: CertificateMap, source: Model, end: Model): Model | string {
  if (map.kind === "lumping" || map.kind === "exact-lumping") {
    if (end.kind !== "markov" && end.kind !== "decimated") return `the chain ends at a ${end.kind}, not a Markov chain`;
    const labels = blockLabels(chainLabels(source), map.partition);
    return { kind: "markov", labels, matrix: modelMatrix(end).map((row) => row.map(formatRational)) };
  }
  if (map.kind === "decimation") return end;
  const { k, r } = caShape(source);
  const R = map.kind === "iterate" ? r * map.steps : Math.ceil((r * map.steps) / map.block);
  const wanted = map.kind === "projection" ? null : map.kind === "iterate" ? k : k ** map.block;
  const shape = caShape(end);
  if (wanted !== null && shape.k !== wanted) return `the chain ends with a CA on ${shape.k} symbols, the composite map gives ${wanted}`;
  if (shape.r === R) return end;
  if (shape.r < R) return `the composite rule has radius ${R}, but the chain ends with radius ${shape.r}`;
  if (map.kind === "blocking") return canonicalModel({ kind: "supercell", base: source, block: map.block, steps: map.steps });
  return ruleTableModel(narrowTable(modelRuleTable(end), R));
}

/**
 * The radius-R table of a radius-r' rule that ignores its outer cells: entry w is the old entry at w with
 * r'−R cells 0 on each side. Sound for a pasted chain because the composite's image of a window depends
 * only on its centre 2R+1 blocks and every coarse window is reached (FORMAT.md, "Pasting", rule 6).
 */
function narrowTable(t: RuleTable, R: number): RuleTable {
  const pad = t.r - R;
  const size = t.k ** (2 * R + 1);
  const table = new Uint8Array(size);
  for (let w = 0; w < size; w++) table[w] = t.table[w * t.k ** pad];
  return { k: t.k, r: R, table };
}
