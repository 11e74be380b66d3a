import type { ChainCheck, EditorLink } from "./chainEditorState";

export type CanvasNode = { id: string; label: string; x: number; y: number; broken: boolean };
export type CanvasEdge = {
  id: string;
  source: string;
  target: string;
  label: string;
  /** "link" is a certified map; "gap" joins a link's target to a next source it does not meet. */
  type: "link" | "gap";
  /** Index of the link this edge stands for (for a gap: the link before it). */
  index: number;
  problem: boolean;
};

const STEP_X = 290;
const GAP_DROP = 80;

/**
 * Lays a chain out left to right: one node per model where links meet, two nodes with a gap edge
 * between them where a link's target is not the next link's source, so the break shows on the
 * canvas right at the link that causes it.
 */
export function chainCanvas(links: EditorLink[], check: ChainCheck, problemLink: number | null = null) {
  const nodes: CanvasNode[] = [];
  const edges: CanvasEdge[] = [];
  const broken = new Set(check.breaks.map((b) => b.index));
  const retracted = new Set(check.retracted);
  let column = 0;
  let previous: CanvasNode | null = null;

  const place = (id: string, label: string, isBroken: boolean, drop = 0): CanvasNode => {
    const node = { id, label, x: column * STEP_X, y: drop, broken: isBroken };
    nodes.push(node);
    column += 1;
    return node;
  };

  links.forEach((link, i) => {
    let from: CanvasNode;
    if (previous === null) {
      from = place(`n${i}-source`, link.source.name, false);
    } else if (broken.has(i - 1)) {
      from = place(`n${i}-source`, link.source.name, true, GAP_DROP);
      edges.push({ id: `gap-${i - 1}`, source: previous.id, target: from.id, label: "does not meet", type: "gap", index: i - 1, problem: true });
    } else {
      from = previous;
    }
    const to = place(`n${i}-target`, link.target.name, broken.has(i));
    const label = `${link.kind}${link.block !== null ? ` N=${link.block}` : ""}`;
    edges.push({
      id: `link-${i}`,
      source: from.id,
      target: to.id,
      label: `${i + 1}. ${label}`,
      type: "link",
      index: i,
      problem: retracted.has(i) || problemLink === i,
    });
    previous = to;
  });
  return { nodes, edges };
}
