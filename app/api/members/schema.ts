import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "@/app/api/_lib/doc";
import { ROLES } from "@/lib/policy";

export const RoleField = z.enum(ROLES, { message: `Choose one of ${ROLES.join(", ")}.` });
export const MemberParams = z.object({ userId: z.string().min(1).max(200) });
export const ChangeRoleBody = z.object({ role: RoleField }).meta({ id: "ChangeRole" });

export const MemberOut = z
  .object({ userId: z.string(), name: z.string(), email: z.string(), role: RoleField })
  .meta({ id: "Member" });

export const memberRoutes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/members",
    summary: "The members of the workspace with their roles",
    tags: ["members"],
    security: SECURITY,
    responses: { 200: jsonBody(z.object({ items: z.array(MemberOut) }), "Members by name"), ...errorResponses("unauthenticated", "forbidden") },
  },
  {
    method: "patch",
    path: "/api/members/{userId}",
    summary: "Change a member's role (admins; the last admin cannot be demoted)",
    tags: ["members"],
    security: SECURITY,
    request: { params: MemberParams, body: jsonBody(ChangeRoleBody, "The new role") },
    responses: {
      200: jsonBody(MemberOut, "The member with the new role"),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found", "conflict"),
    },
  },
  {
    method: "delete",
    path: "/api/members/{userId}",
    summary: "Remove a member (admins; the last admin cannot be removed)",
    tags: ["members"],
    security: SECURITY,
    request: { params: MemberParams },
    responses: {
      200: jsonBody(z.object({ removed: z.literal(true), userId: z.string() }), "Removed"),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found", "conflict"),
    },
  },
];
