import "server-only";
import { getVisibleDraft } from "@/db/queries/drafts";
import { AppError } from "@/server/errors";
import { authorize, type Actor } from "../_lib/actor";

/**
 * The draft a person may change: they may write (contributor or above) and it is theirs. A draft they
 * may only read answers 403, one they may not see 404; either way nothing is written.
 */
export async function ownDraft(actor: Actor, draftId: string) {
  authorize(actor, "chain:submit");
  const draft = await getVisibleDraft({ workspaceId: actor.workspace.id, userId: actor.user.id, draftId });
  if (!draft) throw new AppError("not_found", `No draft ${draftId} that you can see.`, { field: "id" });
  if (draft.ownerId !== actor.user.id) throw new AppError("forbidden", "This draft is shared with you read-only; duplicate it to change it.", { field: "id" });
  return draft;
}
