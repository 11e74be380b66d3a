import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "@/app/api/_lib/doc";
import { OUTBOX_STATUSES } from "@/db/schema";

export const OutboxQuery = z.object({ status: z.enum(OUTBOX_STATUSES).optional() });
export const OutboxParams = z.object({ id: z.string().min(1).max(200) });
const OutboxOut = z
  .object({
    id: z.string(),
    to: z.string(),
    subject: z.string(),
    status: z.enum(OUTBOX_STATUSES),
    attempts: z.number().int(),
    lastError: z.string().nullable(),
    nextAttemptAt: z.string().nullable(),
    sentAt: z.string().nullable(),
    createdAt: z.string(),
  })
  .meta({ id: "OutboxMessage" });

export const outboxRoutes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/outbox",
    summary: "Delivery state of the workspace's mail (admins)",
    tags: ["mail"],
    security: SECURITY,
    request: { query: OutboxQuery },
    responses: { 200: jsonBody(z.object({ items: z.array(OutboxOut) }), "Newest first"), ...errorResponses("bad_input", "unauthenticated", "forbidden") },
  },
  {
    method: "post",
    path: "/api/outbox/{id}/resend",
    summary: "Send a failed message again (admins)",
    tags: ["mail"],
    security: SECURITY,
    request: { params: OutboxParams },
    responses: { 200: jsonBody(z.object({ id: z.string(), status: z.literal("pending") }), "Queued again"), ...errorResponses("unauthenticated", "forbidden", "conflict") },
  },
];
