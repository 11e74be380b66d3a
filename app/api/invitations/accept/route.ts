import { resolveActor } from "@/app/api/_lib/actor";
import { parseBody, route } from "@/app/api/_lib/handler";
import { hashPassword } from "@/server/auth/password";
import { AppError, isAppError } from "@/server/errors";
import { acceptInvitation } from "@/server/team/invitations";
import { AcceptBody } from "../schema";

/**
 * POST /api/invitations/accept `{ "token": "…" }` signed in (session or personal token), or
 * `{ "token", "name", "password" }` signed out to create the invited account.
 */
export const POST = route(async (request) => {
  const body = await parseBody(request, AcceptBody);
  const userId = await signedInUserId(request);
  if (!userId && (!body.name || !body.password))
    throw new AppError("unauthenticated", "Sign in to accept, or send `name` and `password` to create the invited account.", { field: body.name ? "password" : "name" });
  const joined = await acceptInvitation({
    token: body.token,
    userId: userId ?? undefined,
    newAccount: userId ? undefined : { name: body.name!, passwordHash: await hashPassword(body.password!) },
  });
  return Response.json({ workspaceId: joined.workspaceId, role: joined.role, email: joined.email });
});

async function signedInUserId(request: Request): Promise<string | null> {
  try {
    return (await resolveActor(request)).user.id;
  } catch (err) {
    if (isAppError(err) && err.code === "unauthenticated" && request.headers.get("authorization") === null) return null;
    throw err;
  }
}
