import type { GraphEdge, GraphNode } from "./types";

export type ClassMember = { id: string; rule: number; symmetryClass: number };
export type ClassMap = {
  id: string;
  sourceModelId: string;
  targetModelId: string;
  block: number | null;
  retracted?: boolean;
};

export type SymmetryClassGroup = {
  /** The smallest rule number of the class, which names it. */
  symmetryClass: number;
  rules: number[];
  modelIds: string[];
};

/**
 * Collapses ECA models into one node per symmetry class and the maps between them into one edge per
 * ordered pair of classes, labelled with the block sizes that occur; maps within one class become a
 * `loop` label on its node (a loop edge would hide behind the node). Maps whose ends are not ECAs
 * in `members` are left out. Retracted maps count only when no certified map joins the same pair.
 */
export function groupBySymmetryClass(
  members: ClassMember[],
  maps: ClassMap[],
  hrefFor: (symmetryClass: number) => string = (c) => `/atlas?class=${c}`,
): { groups: SymmetryClassGroup[]; nodes: GraphNode[]; edges: GraphEdge[] } {
  const classOf = new Map<string, number>();
  const groups = new Map<number, SymmetryClassGroup>();
  for (const m of members) {
    classOf.set(m.id, m.symmetryClass);
    const group = groups.get(m.symmetryClass) ?? { symmetryClass: m.symmetryClass, rules: [], modelIds: [] };
    if (!group.rules.includes(m.rule)) group.rules.push(m.rule);
    group.modelIds.push(m.id);
    groups.set(m.symmetryClass, group);
  }
  const sorted = [...groups.values()].sort((a, b) => a.symmetryClass - b.symmetryClass);
  for (const g of sorted) g.rules.sort((a, b) => a - b);

  const pairs = new Map<string, { source: number; target: number; blocks: Set<number>; count: number; live: number }>();
  for (const map of maps) {
    const source = classOf.get(map.sourceModelId);
    const target = classOf.get(map.targetModelId);
    if (source === undefined || target === undefined) continue;
    const key = `${source}->${target}`;
    const pair = pairs.get(key) ?? { source, target, blocks: new Set<number>(), count: 0, live: 0 };
    if (map.block !== null) pair.blocks.add(map.block);
    pair.count += 1;
    if (!map.retracted) pair.live += 1;
    pairs.set(key, pair);
  }

  const labelOf = (p: { blocks: Set<number>; count: number }) => {
    const blocks = [...p.blocks].sort((a, b) => a - b);
    const parts = [blocks.length ? `N=${blocks.join(",")}` : null, p.count > 1 ? `${p.count} maps` : null];
    return parts.filter(Boolean).join(" · ") || undefined;
  };
  const loops = new Map([...pairs.values()].filter((p) => p.source === p.target).map((p) => [p.source, labelOf(p) ?? "1 map"]));
  const nodes: GraphNode[] = sorted.map((g) => ({
    id: `class-${g.symmetryClass}`,
    label: `class ${g.symmetryClass}`,
    detail: `ECA ${g.rules.join(", ")}`,
    ...(loops.has(g.symmetryClass) ? { loop: loops.get(g.symmetryClass) } : {}),
    href: hrefFor(g.symmetryClass),
  }));
  const edges: GraphEdge[] = [...pairs.entries()]
    .filter(([, p]) => p.source !== p.target)
    .map(([key, p]) => ({
      id: key,
      source: `class-${p.source}`,
      target: `class-${p.target}`,
      label: labelOf(p),
      retracted: p.live === 0,
    }));
  return { groups: sorted, nodes, edges };
}
