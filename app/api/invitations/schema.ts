import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "@/app/api/_lib/doc";
import { RoleField } from "@/app/api/members/schema";

export const InviteBody = z
  .object({
    email: z.string().trim().min(1, "Enter an e-mail address.").max(254).email("Enter a valid e-mail address."),
    role: RoleField,
    days: z.number().int().min(1).max(30).optional().meta({ description: "Days the link works (default 7)." }),
  })
  .meta({ id: "Invite" });
export const InvitationParams = z.object({ id: z.string().min(1).max(200) });
export const AcceptBody = z
  .object({
    token: z.string().min(20, "The invitation token is incomplete.").max(200),
    name: z.string().trim().min(1, "Enter your name.").max(100).optional(),
    password: z.string().min(10, "Use at least 10 characters.").max(200).optional(),
  })
  .meta({ id: "AcceptInvitation", description: "Signed in: the token alone. Signed out: name and password create the account for the invited address." });

export const InvitationOut = z
  .object({ id: z.string(), email: z.string(), role: RoleField, expiresAt: z.string(), createdAt: z.string() })
  .meta({ id: "Invitation", description: "The link itself is only ever in the mail; only its hash is stored." });

export const invitationRoutes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/invitations",
    summary: "Pending invitations of the workspace (admins)",
    tags: ["members"],
    security: SECURITY,
    responses: { 200: jsonBody(z.object({ items: z.array(InvitationOut) }), "Newest first"), ...errorResponses("unauthenticated", "forbidden") },
  },
  {
    method: "post",
    path: "/api/invitations",
    summary: "Invite an e-mail address with a role (admins); the single-use link is mailed",
    tags: ["members"],
    security: SECURITY,
    request: { body: jsonBody(InviteBody, "Who and with which role") },
    responses: { 201: jsonBody(InvitationOut, "Invited"), ...errorResponses("bad_input", "unauthenticated", "forbidden", "conflict") },
  },
  {
    method: "delete",
    path: "/api/invitations/{id}",
    summary: "Revoke a pending invitation (admins); its link stops working",
    tags: ["members"],
    security: SECURITY,
    request: { params: InvitationParams },
    responses: { 200: jsonBody(z.object({ revoked: z.literal(true), id: z.string() }), "Revoked"), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
  {
    method: "post",
    path: "/api/invitations/{id}/resend",
    summary: "Mail a pending invitation again with a new link and expiry (admins)",
    tags: ["members"],
    security: SECURITY,
    request: { params: InvitationParams },
    responses: { 200: jsonBody(InvitationOut, "Resent"), ...errorResponses("unauthenticated", "forbidden", "not_found", "conflict") },
  },
  {
    method: "post",
    path: "/api/invitations/accept",
    summary: "Accept an invitation: join as yourself, or create the invited account",
    tags: ["members"],
    security: [...SECURITY, {}],
    request: { body: jsonBody(AcceptBody, "The token from the mailed link") },
    responses: {
      200: jsonBody(z.object({ workspaceId: z.string(), role: RoleField, email: z.string() }), "Joined"),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found", "conflict"),
    },
  },
];

export function invitationJson(row: { id: string; email: string; role: string; expiresAt: Date; createdAt: Date }) {
  return { id: row.id, email: row.email, role: row.role, expiresAt: row.expiresAt.toISOString(), createdAt: row.createdAt.toISOString() };
}
