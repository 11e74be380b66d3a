import { z } from "zod";
import { MAP_KINDS, MODEL_KINDS } from "@/db/schema";
import type { Model } from "@/db/schema";
import type { MapView } from "@/db/queries/atlas";
import { ERROR_STATUS } from "@/server/errors";

/** Shapes shared by several routes: the error body, paging, models and maps as the API returns them. */
export const ErrorBody = z
  .object({
    error: z.object({
      code: z.enum(Object.keys(ERROR_STATUS) as [keyof typeof ERROR_STATUS, ...(keyof typeof ERROR_STATUS)[]]),
      message: z.string(),
      field: z.string().optional().meta({ description: "The input field at fault, e.g. `reason` or `query.maxDepth`." }),
      details: z.unknown().optional().meta({ description: "A counterexample, the list of issues, or the bound exceeded." }),
    }),
  })
  .meta({ id: "Error" });

export const Limit = z.coerce.number().int().min(1).max(200).default(50).meta({ description: "Page size (1–200)." });
export const Cursor = z.string().max(500).optional().meta({ description: "`nextCursor` of the previous page." });
export const IdParams = z.object({ id: z.string().min(1).max(200) });
export const ModelKind = z.enum(MODEL_KINDS);
export const MapKind = z.enum(MAP_KINDS);
export const SmallInt = z.coerce.number().int().min(0).max(1_000_000);

export const ModelOut = z
  .object({
    id: z.string(),
    address: z.string().meta({ description: "`sha256:<hex>` of the model's RFC 8785 canonical form." }),
    kind: ModelKind,
    name: z.string(),
    description: z.string(),
    model: z.unknown().meta({ description: "The model in canonical form." }),
    rule: z.number().int().nullable(),
    alphabet: z.number().int().nullable(),
    radius: z.number().int().nullable(),
    states: z.number().int().nullable(),
    block: z.number().int().nullable(),
    steps: z.number().int().nullable(),
    symmetryClass: z.number().int().nullable(),
    baseModelId: z.string().nullable(),
    tags: z.array(z.string()),
    createdAt: z.string(),
  })
  .meta({ id: "Model" });

const ModelRefOut = z.object({
  id: z.string(),
  address: z.string(),
  kind: z.string(),
  name: z.string(),
  rule: z.number().int().nullable(),
});

export const MapOut = z
  .object({
    id: z.string(),
    kind: MapKind,
    source: ModelRefOut,
    target: ModelRefOut,
    block: z.number().int().nullable(),
    steps: z.number().int().nullable(),
    summary: z.string(),
    certificateAddress: z.string(),
    authorId: z.string().nullable(),
    status: z.enum(["certified", "retracted"]),
    retractedReason: z.string().nullable(),
    retractedAt: z.string().nullable(),
    derivedFromMapId: z.string().nullable(),
    derivation: z.string().nullable(),
    createdAt: z.string(),
  })
  .meta({ id: "Map" });

export function pageOf<T extends z.ZodType>(item: T) {
  return z.object({ items: z.array(item), nextCursor: z.string().nullable() });
}

export function modelJson(row: Model) {
  return {
    id: row.id,
    address: row.address,
    kind: row.kind,
    name: row.name,
    description: row.description,
    model: JSON.parse(row.canonical) as unknown,
    rule: row.rule,
    alphabet: row.alphabet,
    radius: row.radius,
    states: row.states,
    block: row.block,
    steps: row.steps,
    symmetryClass: row.symmetryClass,
    baseModelId: row.baseModelId,
    tags: JSON.parse(row.tags) as string[],
    createdAt: row.createdAt.toISOString(),
  };
}

export function mapJson(view: MapView) {
  return {
    id: view.id,
    kind: view.kind,
    source: view.source,
    target: view.target,
    block: view.block,
    steps: view.steps,
    summary: view.summary,
    certificateAddress: view.certificateAddress,
    authorId: view.authorId,
    status: view.status,
    retractedReason: view.retractedReason,
    retractedAt: view.retractedAt?.toISOString() ?? null,
    derivedFromMapId: view.derivedFromMapId,
    derivation: view.derivation,
    createdAt: view.createdAt.toISOString(),
  };
}
