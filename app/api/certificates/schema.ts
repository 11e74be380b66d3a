import { z } from "zod";
import { MAX_BODY_BYTES } from "../_lib/handler-limits";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../_lib/doc";

const Rule = z.number().int().min(0).max(255);
const Table = z.object({ k: z.number().int().min(2).max(256), r: z.number().int().min(1).max(64), table: z.array(z.number().int().min(0).max(255)) });
const Steps = z.number().int().min(1).max(1_000_000);
const Chain = z.looseObject({ kind: z.string() }).meta({ description: "A Markov chain model (see POST /api/models)." });

/** A claim the server turns into a certificate and checks, for scripts that do not run the core. */
export const BuildRequest = z
  .discriminatedUnion("kind", [
    z.object({ kind: z.literal("projection"), rule: Rule.optional(), table: Table.optional(), block: Steps, steps: Steps.optional(), projection: z.union([z.array(z.number().int().min(0).max(255)), z.string().max(100_000)]) }),
    z.object({ kind: z.literal("lumping"), chain: Chain, partition: z.array(z.number().int().min(0)).min(1), steps: Steps.optional() }),
    z.object({ kind: z.literal("decimation"), chain: Chain, steps: Steps }),
    z.object({ kind: z.literal("blocking"), rule: Rule.optional(), table: Table.optional(), block: Steps, steps: Steps.optional() }),
    z.object({ kind: z.literal("iterate"), rule: Rule.optional(), table: Table.optional(), steps: Steps }),
  ])
  .meta({ id: "BuildRequest" });

export const SubmitBody = z
  .object({
    certificate: z
      .looseObject({ format: z.string() })
      .optional()
      .meta({
        description: "A certificate as issued by the core (format squarely-certificate, version 1); see GET /api/certificates/schema.",
      }),
    build: BuildRequest.optional(),
  })
  .refine((b) => (b.certificate === undefined) !== (b.build === undefined), {
    message: "Send exactly one of `certificate` or `build`.",
    path: ["certificate"],
  })
  .meta({ id: "SubmitCertificateRequest", description: `Either a certificate or a claim to build one from; at most ${MAX_BODY_BYTES} bytes.` });

export const SubmitOut = z
  .object({
    status: z.enum(["created", "existing"]),
    mapId: z.string(),
    address: z.string(),
  })
  .meta({ id: "SubmitResult" });

export const routes: RouteConfig[] = [
  {
    method: "post",
    path: "/api/certificates",
    summary: "Submit a certificate (or a claim to certify); the server re-verifies it before writing",
    description:
      "The checker runs in a worker thread within the configured limits. A square that does not commute answers 422 with the counterexample and writes nothing. The same certificate twice returns the existing record with 200.",
    tags: ["certificates"],
    security: SECURITY,
    request: { body: jsonBody(SubmitBody, "The certificate or the claim.") },
    responses: {
      201: jsonBody(SubmitOut, "Verified and stored: a new map."),
      200: jsonBody(SubmitOut, "Stored before: the existing map."),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "too_large", "unsupported_media_type", "does_not_commute", "too_many_requests"),
    },
  },
];
