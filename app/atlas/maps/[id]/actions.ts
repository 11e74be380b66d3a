"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import type { RetractState } from "@/components/atlas/retract-form";
import { retractMap } from "@/db/queries/atlas";
import { isAppError } from "@/server/errors";
import { requireAction } from "@/server/context";

const RetractSchema = z.object({
  mapId: z.string().min(1).max(100),
  reason: z.string().trim().min(3, "Say in at least 3 characters why the map is retracted.").max(1000, "Keep the reason under 1000 characters."),
});

/** Retracts a map; the role is checked again here, whatever the page showed. */
export async function retractMapAction(mapId: string, _state: RetractState, form: FormData): Promise<RetractState> {
  const { workspace, user } = await requireAction("map:retract");
  const parsed = RetractSchema.safeParse({ mapId, reason: form.get("reason") ?? "" });
  if (!parsed.success) {
    const reason = parsed.error.issues.find((i) => i.path[0] === "reason");
    return { status: "error", reasonError: reason?.message ?? "The map id is not valid.", message: reason ? undefined : "The map id is not valid." };
  }
  try {
    await retractMap({ workspaceId: workspace.id, mapId: parsed.data.mapId, userId: user.id, reason: parsed.data.reason });
  } catch (err) {
    if (isAppError(err)) return { status: "error", message: err.message };
    throw err;
  }
  revalidatePath(`/atlas/maps/${mapId}`);
  return { status: "ok", message: "The map is retracted; watchers of its models will be told." };
}
