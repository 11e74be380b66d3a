import { z } from "zod";
import { ModelSchema, type Model } from "@/lib/models";

export const CERTIFICATE_FORMAT = "squarely-certificate";
export const CERTIFICATE_VERSION = 1;

const positive = z.number().int().min(1).max(1_000_000_000);
const symbol = z.number().int().min(0).max(255);

/**
 * The map a certificate claims (DOMAIN.md §2). `lumping` with steps s lumps P^s (the composite of a
 * decimation and a lumping, DOMAIN.md §3); `projection` is the coarse-graining blocking-then-projection.
 */
export const MapSchema = z.discriminatedUnion("kind", [
  z.strictObject({ kind: z.literal("projection"), block: positive, steps: positive.optional(), projection: z.array(symbol).min(1) }),
  z.strictObject({ kind: z.literal("lumping"), partition: z.array(z.number().int().min(0).max(1_000_000)).min(1), steps: positive.optional() }),
  // exact lumping (Buchholz 1994, DOMAIN.md §2b): column sums into each block are equal within the target block
  z.strictObject({ kind: z.literal("exact-lumping"), partition: z.array(z.number().int().min(0).max(1_000_000)).min(1), steps: positive.optional() }),
  z.strictObject({ kind: z.literal("decimation"), steps: positive }),
  z.strictObject({ kind: z.literal("blocking"), block: positive, steps: positive.optional() }),
  z.strictObject({ kind: z.literal("iterate"), steps: positive }),
]);

export const ADDRESS_PATTERN = /^sha256:[0-9a-f]{64}$/;

/**
 * A certificate, version 1: everything an independent checker needs — both models in full, the map with
 * its parameters; the target is the claim. `address`, when present, seals the content: it must equal the
 * address of the rest, so a changed byte is refused.
 */
export const CertificateSchema = z.strictObject({
  format: z.literal(CERTIFICATE_FORMAT),
  version: z.literal(CERTIFICATE_VERSION),
  map: MapSchema,
  source: ModelSchema,
  target: ModelSchema,
  address: z.string().regex(ADDRESS_PATTERN, "expected sha256:<64 lowercase hex digits>").optional(),
});

export type CertificateMap =
  | { kind: "projection"; block: number; steps: number; projection: number[] }
  | { kind: "lumping"; partition: number[]; steps: number }
  | { kind: "exact-lumping"; partition: number[]; steps: number }
  | { kind: "decimation"; steps: number }
  | { kind: "blocking"; block: number; steps: number }
  | { kind: "iterate"; steps: number };

/** A certificate in canonical form: models canonical, defaults filled in, partition renumbered. */
export type Certificate = {
  format: typeof CERTIFICATE_FORMAT;
  version: typeof CERTIFICATE_VERSION;
  map: CertificateMap;
  source: Model;
  target: Model;
  address?: string;
};

export type MapKind = CertificateMap["kind"];

export function certificateJsonSchema(): Record<string, unknown> {
  return z.toJSONSchema(CertificateSchema) as Record<string, unknown>;
}
