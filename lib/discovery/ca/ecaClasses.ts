import { ecaClassRepresentative } from "./ecaSymmetry";

/** The 88 ECA symmetry classes (reflection and complement), each with its smallest rule as representative. */
export function ecaClasses(): { representative: number; members: number[] }[] {
  const byRep = new Map<number, number[]>();
  for (let rule = 0; rule < 256; rule++) {
    const rep = ecaClassRepresentative(rule);
    const list = byRep.get(rep);
    if (list) list.push(rule);
    else byRep.set(rep, [rule]);
  }
  return [...byRep].map(([representative, members]) => ({ representative, members }));
}
