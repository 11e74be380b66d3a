import { fromDigits, toDigits, type RuleTable } from "@/lib/ca";
import { canonicalModel, caShape, isCaLike, modelRuleTable, ruleTableModel, type Model } from "@/lib/models";
import { sealCertificate, type Certificate, type CertificateMap } from "@/lib/certificate";
import { complementTable, reflectTable } from "./ruleSymmetries";

export class SymmetryError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "SymmetryError";
  }
}

/**
 * The reflected certificate reflect(f) → reflect(g) (DOMAIN.md §4): each block is reflected before it is
 * projected. Returned sealed but unverified: callers re-check it like any other certificate.
 */
export function reflectCertificate(cert: Certificate): Certificate {
  // A block of N source symbols is N·c base cells when each symbol is itself a supercell of c cells:
  // reflection reverses all of them, the cells inside each symbol as well as the symbols' order.
  return transform(cert, reflectTable, (s, _k, N, cells) => fromDigits(toDigits(s, cells.k, N * cells.c).reverse(), cells.k));
}

/**
 * The complemented certificate complement(f) → complement(g) (DOMAIN.md §4): the projection's inputs and
 * outputs are complemented, p'(X) = m−1−p(complement X).
 */
export function complementCertificate(cert: Certificate): Certificate {
  return transform(cert, complementTable, (s, k, N) => k ** N - 1 - s, true);
}

/** Base cells per symbol (c) and the base alphabet (k) of a CA-like model: a supercell symbol is a block of base cells. */
function baseCells(model: Model): { k: number; c: number } {
  if (model.kind === "supercell") {
    const inner = baseCells(model.base);
    return { k: inner.k, c: inner.c * model.block };
  }
  if (model.kind === "iterate") return baseCells(model.base);
  return { k: caShape(model).k, c: 1 };
}

type OnBlock = (s: number, k: number, N: number, cells: { k: number; c: number }) => number;

function transform(cert: Certificate, onTable: (t: RuleTable) => RuleTable, onBlock: OnBlock, flipsOutput = false): Certificate {
  const { map, source, target } = cert;
  if (!isCaLike(source) || !isCaLike(target)) throw new SymmetryError(`reflection and complement act on cellular automata, not on a ${source.kind}`);
  const onModel = (m: Model): Model => {
    if (m.kind === "supercell" || m.kind === "iterate") return canonicalModel({ ...m, base: onModel(m.base) });
    return ruleTableModel(onTable(modelRuleTable(m)));
  };
  let newMap: CertificateMap = map;
  if (map.kind === "projection") {
    const { k } = caShape(source);
    const m = Math.max(...map.projection) + 1;
    const projection = map.projection.map((_, s) => {
      const y = map.projection[onBlock(s, k, map.block, baseCells(source))];
      return flipsOutput ? m - 1 - y : y;
    });
    newMap = { ...map, projection };
  }
  return sealCertificate({ format: cert.format, version: cert.version, map: newMap, source: onModel(source), target: onModel(target) });
}
