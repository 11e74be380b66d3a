import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "@/app/api/_lib/doc";

export const AuditQuery = z.object({
  action: z.string().min(1).max(100).optional().meta({ description: "One kind, e.g. `map:create`." }),
  actorId: z.string().min(1).max(200).optional().meta({ description: "One person's user id." }),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

const AuditOut = z
  .object({ id: z.string(), action: z.string(), text: z.string(), actorId: z.string().nullable(), actorName: z.string().nullable(), subjectType: z.string(), subjectId: z.string(), createdAt: z.string() })
  .meta({ id: "AuditEvent" });

export const auditRoutes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/audit",
    summary: "The workspace's audit log, newest first, by kind and person, paged (admins)",
    tags: ["audit"],
    security: SECURITY,
    request: { query: AuditQuery },
    responses: { 200: jsonBody(z.object({ items: z.array(AuditOut), total: z.number().int(), page: z.number().int() }), "One page"), ...errorResponses("bad_input", "unauthenticated", "forbidden") },
  },
];
