import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "@/app/api/_lib/doc";
import { RoleField } from "@/app/api/members/schema";

export const CreateWorkspaceBody = z
  .object({ name: z.string().trim().min(1, "Name the workspace.").max(100, "Use at most 100 characters.") })
  .meta({ id: "CreateWorkspace" });
export const PublicViewBody = z
  .object({ publicView: z.boolean({ message: "Send true or false." }) })
  .meta({ id: "PublicView", description: "true: anyone may read the atlas at /public/{slug} without signing in (no members, addresses or tokens)." });

const WorkspaceOut = z.object({ id: z.string(), slug: z.string(), name: z.string(), role: RoleField }).meta({ id: "Workspace" });

export const workspaceRoutes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/workspaces",
    summary: "The workspaces you belong to, with your role in each",
    tags: ["workspaces"],
    security: SECURITY,
    responses: { 200: jsonBody(z.object({ items: z.array(WorkspaceOut) }), "Yours"), ...errorResponses("unauthenticated") },
  },
  {
    method: "post",
    path: "/api/workspaces",
    summary: "Create a workspace; you are its admin",
    tags: ["workspaces"],
    security: SECURITY,
    request: { body: jsonBody(CreateWorkspaceBody, "Its name") },
    responses: { 201: jsonBody(WorkspaceOut, "Created"), ...errorResponses("bad_input", "unauthenticated") },
  },
  {
    method: "patch",
    path: "/api/workspaces/current",
    summary: "Turn the public read-only view of the current workspace on or off (admins)",
    tags: ["workspaces"],
    security: SECURITY,
    request: { body: jsonBody(PublicViewBody, "On or off") },
    responses: {
      200: jsonBody(z.object({ id: z.string(), slug: z.string(), publicView: z.boolean(), publicUrl: z.string().nullable() }), "The setting"),
      ...errorResponses("bad_input", "unauthenticated", "forbidden"),
    },
  },
];
