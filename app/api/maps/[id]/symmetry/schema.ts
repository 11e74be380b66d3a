import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../../../_lib/doc";
import { IdParams } from "../../../_lib/schemas";

export const Params = IdParams;

export const SymmetryOut = z
  .object({
    created: z.array(z.object({ status: z.enum(["created", "existing"]), mapId: z.string(), address: z.string() })),
    skipped: z.array(z.object({ derivation: z.enum(["reflect", "complement", "reflect-complement"]), reason: z.string() })),
  })
  .meta({ id: "SymmetryImages" });

export const routes: RouteConfig[] = [
  {
    method: "post",
    path: "/api/maps/{id}/symmetry",
    summary: "Add the reflected and complemented images of a CA map, each re-verified and marked as derived",
    tags: ["maps"],
    security: SECURITY,
    request: { params: Params },
    responses: {
      200: jsonBody(SymmetryOut, "The images stored (or found), and the ones skipped with why."),
      ...errorResponses("unauthenticated", "forbidden", "not_found", "too_large", "does_not_commute"),
    },
  },
];
