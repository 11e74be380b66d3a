/**
 * Moving search results along the ECA symmetries (DOMAIN.md §4). If p projects rule f onto g at block N, then
 * p∘rev projects reflect(f) onto reflect(g), and s ↦ p(~s) (with coarse symbols kept) projects complement(f)
 * onto the coarse rule conjugated by the same relabelling. Every transported result is re-verified by the
 * core's checker in the tests.
 */
import { complementEca, reflectEca, reverseBlock } from "./ecaSymmetry";

export type Transport = "identity" | "reflect" | "complement" | "reflect-complement";

/** How `rule` is obtained from its class representative `rep`. */
export function transportFrom(rep: number, rule: number): Transport {
  if (rule === rep) return "identity";
  if (rule === reflectEca(rep)) return "reflect";
  if (rule === complementEca(rep)) return "complement";
  if (rule === complementEca(reflectEca(rep))) return "reflect-complement";
  throw new RangeError(`rule ${rule} is not in the class of ${rep}`);
}

/** A coarse-graining: projection onto m symbols and the coarse radius-1 table over m^3 neighbourhoods. */
export interface CoarseMap {
  projection: number[];
  table: number[];
}

function relabelCanonical(map: CoarseMap): CoarseMap {
  const sigma = new Map<number, number>();
  for (const c of map.projection) if (!sigma.has(c)) sigma.set(c, sigma.size);
  const m = sigma.size;
  const table = new Array<number>(m * m * m);
  for (let X = 0; X < m; X++)
    for (let Y = 0; Y < m; Y++)
      for (let Z = 0; Z < m; Z++) table[((sigma.get(X) as number) * m + (sigma.get(Y) as number)) * m + (sigma.get(Z) as number)] = sigma.get(map.table[(X * m + Y) * m + Z]) as number;
  return { projection: map.projection.map((c) => sigma.get(c) as number), table };
}

function reflectMap(map: CoarseMap, block: number): CoarseMap {
  const m = Math.round(Math.cbrt(map.table.length));
  const table = new Array<number>(map.table.length);
  for (let X = 0; X < m; X++) for (let Y = 0; Y < m; Y++) for (let Z = 0; Z < m; Z++) table[(X * m + Y) * m + Z] = map.table[(Z * m + Y) * m + X];
  return { projection: map.projection.map((_, s) => map.projection[reverseBlock(s, block)]), table };
}

function complementMap(map: CoarseMap, block: number): CoarseMap {
  const mask = (1 << block) - 1;
  return { projection: map.projection.map((_, s) => map.projection[s ^ mask]), table: map.table.slice() };
}

/**
 * Transport a coarse-graining of `rep` to the rule `transport` names. With `canonical`, coarse symbols are
 * renumbered by first appearance (partitions); without, they are kept (binary projections onto {0, 1}).
 */
export function transportMap(map: CoarseMap, transport: Transport, block: number, canonical: boolean): CoarseMap {
  let out = map;
  if (transport === "reflect" || transport === "reflect-complement") out = reflectMap(out, block);
  if (transport === "complement" || transport === "reflect-complement") out = complementMap(out, block);
  return canonical ? relabelCanonical(out) : out;
}

/** Binary target transported the same way, as an ECA rule number. */
export function transportTarget(target: number, transport: Transport): number {
  let t = target;
  if (transport === "reflect" || transport === "reflect-complement") t = reflectEca(t);
  // the projection keeps its symbols, so the coarse rule is conjugated by nothing: g(x,y,z) stays g
  return t;
}
