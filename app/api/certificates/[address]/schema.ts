import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../../_lib/doc";

export const Params = z.object({
  address: z.string().regex(/^sha256:[0-9a-f]{64}$/, "expected sha256:<64 lowercase hex digits>"),
});

export const CertificateOut = z
  .object({
    address: z.string(),
    kind: z.string(),
    formatVersion: z.number().int(),
    checkerVersion: z.string().meta({ description: "The checker that verified it on this server." }),
    verifiedAt: z.string(),
    certificate: z.unknown().meta({ description: "The certificate in canonical form (RFC 8785)." }),
  })
  .meta({ id: "StoredCertificate" });

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/certificates/{address}",
    summary: "A certificate of this workspace (cited by one of its maps or chains) by its content address, with the checker version that verified it",
    tags: ["certificates"],
    security: SECURITY,
    request: { params: Params },
    responses: { 200: jsonBody(CertificateOut, "The certificate."), ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found") },
  },
];
