import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "@/app/api/_lib/doc";
import { Cursor, Limit } from "@/app/api/_lib/schemas";
import { MAIL_DELIVERIES } from "@/db/schema";

export const ListQuery = z.object({ limit: Limit, cursor: Cursor });

export const Delivery = z.enum(MAIL_DELIVERIES, { message: `Choose one of ${MAIL_DELIVERIES.join(", ")}.` });
export const DeliveryBody = z.object({ delivery: Delivery }).meta({ id: "MailDelivery", description: "`immediate`: one mail per event; `digest`: one mail a day; `off`: none." });
export const ReadBody = z
  .object({ ids: z.array(z.string().min(1).max(200)).max(500).optional().meta({ description: "Leave out to mark all read." }) })
  .meta({ id: "MarkRead" });

const NotificationOut = z
  .object({ id: z.string(), title: z.string(), body: z.string(), link: z.string(), read: z.boolean(), createdAt: z.string() })
  .meta({ id: "Notification" });

export const notificationRoutes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/notifications",
    summary: "Your notifications in this workspace, the unread count and your mail choice",
    tags: ["watches"],
    security: SECURITY,
    request: { query: ListQuery },
    responses: {
      200: jsonBody(z.object({ unread: z.number().int(), delivery: Delivery, items: z.array(NotificationOut), nextCursor: z.string().nullable() }), "One page, newest first"),
      ...errorResponses("unauthenticated", "forbidden"),
    },
  },
  {
    method: "post",
    path: "/api/notifications/read",
    summary: "Mark notifications read",
    tags: ["watches"],
    security: SECURITY,
    request: { body: jsonBody(ReadBody, "Which") },
    responses: { 200: jsonBody(z.object({ marked: z.number().int(), unread: z.number().int() }), "Done"), ...errorResponses("bad_input", "unauthenticated", "forbidden") },
  },
  {
    method: "put",
    path: "/api/notifications/delivery",
    summary: "Choose immediate mail, a daily digest, or no watch mail",
    tags: ["watches"],
    security: SECURITY,
    request: { body: jsonBody(DeliveryBody, "The choice") },
    responses: { 200: jsonBody(DeliveryBody, "Saved"), ...errorResponses("bad_input", "unauthenticated", "forbidden") },
  },
];
