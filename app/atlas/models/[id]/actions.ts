"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { fieldErrorsOf, type FormState } from "@/components/ui/form-state";
import { updateModelDetails } from "@/db/queries/models";
import { requireAction } from "@/server/context";

const DetailsSchema = z.object({
  name: z.string().trim().min(1, "Give the model a name.").max(120, "Keep the name under 120 characters."),
  description: z.string().trim().max(2000, "Keep the description under 2000 characters."),
});

export type ModelDetailsField = "name" | "description";

/**
 * A contributor renames a model or describes it for the workspace. Creating models needs the same
 * role, so the policy's "model:create" decides; the role is checked again here, whatever the page showed.
 */
export async function updateModelDetailsAction(modelId: string, _state: FormState<ModelDetailsField>, form: FormData): Promise<FormState<ModelDetailsField>> {
  const { workspace, user } = await requireAction("model:create");
  const values = { name: String(form.get("name") ?? ""), description: String(form.get("description") ?? "") };
  const parsed = DetailsSchema.safeParse(values);
  if (!parsed.success) return { status: "error", fieldErrors: fieldErrorsOf<ModelDetailsField>(parsed.error.issues), values };
  const updated = await updateModelDetails({ workspaceId: workspace.id, modelId, userId: user.id, ...parsed.data });
  if (!updated) return { status: "error", message: "This model is not in the current workspace.", values };
  revalidatePath(`/atlas/models/${modelId}`);
  return { status: "ok", message: "Saved. The content address is unchanged; only this workspace's name and description changed.", values: parsed.data };
}
