import type { Certificate } from "@/lib/certificate";
import type { JobParamsResult } from "./jobForms";

/** The job kinds whose forms pick certified maps of the atlas rather than typed numbers. */
export const MAP_FORM_KINDS = ["verify-map", "verify-chain"] as const;
export type MapFormKind = (typeof MAP_FORM_KINDS)[number];

/** A certified map chosen on a job form; `certificate` is its stored certificate once read (undefined while reading). */
export type PickedMap = {
  id: string;
  label: string;
  source: { id: string; name: string };
  target: { id: string; name: string };
  certificate?: unknown;
  readError?: string;
};

/** The verify-chain job's bound on links (server/jobs/kinds/verify-chain.compute.ts). */
export const CHAIN_LINKS_MAX = 64;
const NAME_MAX = 200;

type Build = Record<string, unknown>;

/** A CA source as the builder takes it: an ECA by its rule, a CA by its table; derived models are refused (see mapCheckBuild). */
function ruleOf(source: Certificate["source"]): Build | string {
  if (source.kind === "eca") return { rule: source.rule };
  if (source.kind === "ca") return { table: { k: source.k, r: source.r, table: source.table } };
  return `its source is a derived model (${source.kind}); a map check rebuilds a map only from an ECA or a rule table`;
}

/**
 * The claim the verify-map job rebuilds and re-checks, from a stored certificate: the same source and
 * map parameters, so that the job's certificate is this map's own (same address). Kinds the job does
 * not take, and sources the builder would re-spell (a derived CA becomes a table, another address),
 * are refused with a sentence.
 */
export function mapCheckBuild(certificate: unknown): { build: Build } | { error: string } {
  const c = certificate as Partial<Certificate> | null;
  if (!c || typeof c !== "object" || !c.map || !c.source) return { error: "Its certificate could not be read." };
  const { map, source } = c;
  if (map.kind === "lumping" || map.kind === "decimation") {
    if (source.kind !== "markov" && source.kind !== "decimated") return { error: "Its source is not a Markov chain." };
    return { build: map.kind === "lumping" ? { kind: "lumping", chain: source, partition: map.partition, steps: map.steps } : { kind: "decimation", chain: source, steps: map.steps } };
  }
  if (map.kind === "projection" || map.kind === "blocking" || map.kind === "iterate") {
    const rule = ruleOf(source);
    if (typeof rule === "string") return { error: `A map check cannot rebuild this map: ${rule}.` };
    if (map.kind === "projection") return { build: { kind: "projection", ...rule, block: map.block, steps: map.steps, projection: map.projection } };
    if (map.kind === "blocking") return { build: { kind: "blocking", ...rule, block: map.block, steps: map.steps } };
    return { build: { kind: "iterate", ...rule, steps: map.steps } };
  }
  return { error: `A map check takes projections, lumpings, decimations, blockings and iterates; this map is of kind “${String((map as { kind?: unknown }).kind)}”.` };
}

/** Params of the verify-map job from the map chosen, or the error for the map field. */
export function verifyMapParams(picked: PickedMap | null): JobParamsResult {
  if (!picked) return { params: null, errors: { map: "Choose a certified map." } };
  if (picked.readError) return { params: null, errors: { map: picked.readError } };
  if (picked.certificate === undefined) return { params: null, errors: { map: "Reading its certificate…" } };
  const built = mapCheckBuild(picked.certificate);
  return "error" in built ? { params: null, errors: { map: built.error } } : { params: { build: built.build }, errors: {} };
}

/** The first link that does not start where the one before it ends, in words; null when every link meets the next. */
export function chainGap(maps: PickedMap[]): string | null {
  for (let i = 1; i < maps.length; i++) {
    const [before, link] = [maps[i - 1], maps[i]];
    if (link.source.id !== before.target.id) return `Link ${i + 1} starts at ${link.source.name}, but link ${i} ends at ${before.target.name}.`;
  }
  return null;
}

function linksError(maps: PickedMap[]): string | null {
  if (maps.length === 0) return "Add at least one map.";
  if (maps.length > CHAIN_LINKS_MAX) return `A chain check takes at most ${CHAIN_LINKS_MAX} links.`;
  const unread = maps.findIndex((m) => m.readError);
  if (unread >= 0) return `Link ${unread + 1}: ${maps[unread].readError}`;
  const gap = chainGap(maps);
  if (gap) return gap;
  return maps.some((m) => m.certificate === undefined) ? "Reading the certificates…" : null;
}

/** Params of the verify-chain job: its name, the chosen maps' certificates in order, and whether to store the chain. */
export function verifyChainParams(fields: { name: string; save: boolean }, maps: PickedMap[]): JobParamsResult {
  const errors: Record<string, string> = {};
  const name = fields.name.trim();
  if (!name) errors.name = "Give the chain a name.";
  else if (name.length > NAME_MAX) errors.name = `Keep the name under ${NAME_MAX} characters.`;
  const links = linksError(maps);
  if (links) errors.maps = links;
  if (Object.keys(errors).length) return { params: null, errors };
  return { params: { name, certificates: maps.map((m) => m.certificate), save: fields.save }, errors };
}

/** The chosen maps with link `i` moved by `by` places (−1 up, +1 down); unchanged at either end. */
export function moveLink<T>(maps: T[], i: number, by: -1 | 1): T[] {
  const j = i + by;
  if (i < 0 || i >= maps.length || j < 0 || j >= maps.length) return maps;
  const next = [...maps];
  [next[i], next[j]] = [next[j], next[i]];
  return next;
}
