import { chainSize, isCaLike, isChainLike, caShape, type Issue } from "@/lib/models";
import type { Certificate } from "@/lib/certificate";

/** Problems that make a certificate meaningless (wrong kinds of model for the map, sizes that do not fit). */
export function structureIssues(cert: Certificate): Issue[] {
  const { map, source, target } = cert;
  const issues: Issue[] = [];
  const chainMap = map.kind === "lumping" || map.kind === "exact-lumping" || map.kind === "decimation";
  const fits = chainMap ? isChainLike : isCaLike;
  const want = chainMap ? "a Markov chain" : "a cellular automaton";
  if (!fits(source)) issues.push({ path: "source", message: `a ${map.kind} certificate needs ${want} as its source, not a ${source.kind}` });
  if (!fits(target)) issues.push({ path: "target", message: `a ${map.kind} certificate needs ${want} as its target, not a ${target.kind}` });
  if (issues.length > 0) return issues;
  if ((map.kind === "lumping" || map.kind === "exact-lumping") && map.partition.length !== chainSize(source))
    issues.push({ path: "map.partition", message: `has ${map.partition.length} entries for a ${chainSize(source)}-state chain` });
  if (map.kind === "projection") {
    const { k } = caShape(source);
    const states = k ** map.block;
    if (map.projection.length !== states) issues.push({ path: "map.projection", message: `has ${map.projection.length} entries; block ${map.block} over ${k} symbols has ${states} states` });
    else if (map.projection.every((y) => y === 0))
      issues.push({ path: "map.projection", message: "maps every block state to 0: a constant projection names one coarse symbol, and a coarse CA needs at least two (k ≥ 2); use every symbol 0..m-1 with m ≥ 2" });
  }
  return issues;
}
