import { z } from "zod";

export const BUNDLE_FORMAT = "squarely-workspace";
export const BUNDLE_VERSION = 1;

const Address = z.string().regex(/^sha256:[0-9a-f]{64}$/, "a content address sha256:<64 hex digits>");
const Json = z.looseObject({});

/**
 * A whole workspace as one JSON document (our own format, version 1): models by canonical form,
 * certificates as issued (each sealed by its own address), and maps, chains and search records that
 * refer to them by content address only. Nothing in it is trusted on import.
 */
export const WorkspaceBundle = z
  .strictObject({
    format: z.literal(BUNDLE_FORMAT),
    version: z.literal(BUNDLE_VERSION),
    exportedAt: z.string().max(40),
    workspace: z.strictObject({ name: z.string().max(200) }),
    models: z
      .array(z.strictObject({ address: Address, name: z.string().min(1).max(200), description: z.string().max(2000), tags: z.array(z.string().max(100)).max(50), model: Json }))
      .max(100_000),
    certificates: z.array(Json).max(100_000),
    maps: z
      .array(
        z.strictObject({
          certificate: Address,
          status: z.enum(["certified", "retracted"]),
          retractedReason: z.string().max(1000).nullable(),
          retractedAt: z.string().max(40).nullable(),
          derivation: z.enum(["reflect", "complement", "reflect-complement"]).nullable(),
          derivedFrom: Address.nullable(),
        }),
      )
      .max(100_000),
    chains: z.array(z.strictObject({ name: z.string().min(1).max(200), composite: Address, verification: z.enum(["links", "links+composite"]), links: z.array(Address).min(1).max(64) })).max(10_000),
    searchRecords: z
      .array(
        z.strictObject({
          model: Address,
          kind: z.string().max(100),
          maxBlock: z.number().int().nullable(),
          algorithm: z.string().max(2000),
          algorithmVersion: z.string().max(100),
          coverage: Json,
          outcome: Json,
          found: z.number().int().min(0),
        }),
      )
      .max(100_000),
  })
  .meta({ id: "WorkspaceBundle", description: "A whole workspace: models, certificates, maps, chains and search records." });
export type WorkspaceBundle = z.infer<typeof WorkspaceBundle>;
