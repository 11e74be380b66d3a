import type { CanonicalView } from "@/components/atlas/canonicalView";
import { viewOf } from "@/components/atlas/canonicalView";
import type { RuleView } from "./space-time-explorer";

/** The rule table of an ECA (bit i of the Wolfram code is the entry for neighbourhood i) or 1-D CA; null for anything else. */
export function ruleViewOf(view: CanonicalView): RuleView | null {
  if (view.type === "eca") return { k: 2, r: 1, table: Array.from({ length: 8 }, (_, i) => (view.rule >> i) & 1) };
  if (view.type === "ca") return { k: view.k, r: view.r, table: view.table };
  return null;
}

export type PictureInput = { fine: RuleView; coarse: RuleView; block: number; steps: number; projection: number[] };

/**
 * What the three-panel picture needs from a projection certificate (lib/certificate/FORMAT.md):
 * both rule tables, block size, steps (default the block size) and the projection. Null for other
 * maps, or a source the picture cannot run (a derived model).
 */
export function pictureInputOf(certificateBody: string): PictureInput | null {
  let cert: Record<string, unknown>;
  try {
    cert = JSON.parse(certificateBody) as Record<string, unknown>;
  } catch {
    return null;
  }
  const map = cert.map as Record<string, unknown> | undefined;
  if (!map || map.kind !== "projection" || !Array.isArray(map.projection)) return null;
  const block = Number(map.block);
  const steps = map.steps === undefined ? block : Number(map.steps);
  const fine = ruleViewOf(viewOf(cert.source));
  const coarse = ruleViewOf(viewOf(cert.target));
  if (!fine || !coarse || !Number.isInteger(block) || !Number.isInteger(steps)) return null;
  return { fine, coarse, block, steps, projection: map.projection.map(Number) };
}
