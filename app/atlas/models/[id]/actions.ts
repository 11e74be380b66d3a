"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { canonicalView } from "@/components/atlas/canonicalView";
import { z } from "zod";
import { fieldErrorsOf, type FormState } from "@/components/ui/form-state";
import { getModel, updateModelDetails } from "@/db/queries/models";
import { isAppError } from "@/server/errors";
import { getJobQueue } from "@/server/jobs";
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

const ApartSchema = z.array(z.coerce.number().int().min(0)).max(5000);

/**
 * Starts the existing lump-chain job on this chain: each ticked state gets its own observable value
 * and the rest share one, so the coarsest strong lumping found keeps the ticked states apart.
 */
export async function findLumpingAction(modelId: string, _state: FormState<"apart">, form: FormData): Promise<FormState<"apart">> {
  const { workspace, user } = await requireAction("job:create");
  const model = await getModel({ workspaceId: workspace.id, idOrAddress: modelId });
  const view = model ? canonicalView(model.canonical) : null;
  if (!model || !view || view.type !== "markov") return { status: "error", message: "This model is not a Markov chain of this workspace." };
  const parsed = ApartSchema.safeParse(form.getAll("apart"));
  if (!parsed.success || parsed.data.some((i) => i >= view.matrix.length)) return { status: "error", fieldErrors: { apart: ["Tick states of this chain."] } };
  if (parsed.data.length < 2) return { status: "error", fieldErrors: { apart: ["Tick at least two states to keep apart."] } };
  const apart = new Set(parsed.data);
  const observable = view.matrix.map((_, i) => (apart.has(i) ? `state ${i}` : "any"));
  let jobId: string;
  try {
    const job = await getJobQueue().enqueue({
      workspaceId: workspace.id,
      ownerId: user.id,
      kind: "lump-chain",
      params: { chain: { kind: "markov", labels: view.labels, matrix: view.matrix }, observable },
    });
    jobId = job.id;
  } catch (err) {
    if (isAppError(err)) return { status: "error", message: err.message };
    throw err;
  }
  redirect(`/jobs/${jobId}`);
}
