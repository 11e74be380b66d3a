"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import type { FormState } from "@/components/ui/form-state";
import { setMailDelivery } from "@/db/queries/memberships";
import { markNotificationsRead } from "@/db/queries/notifications";
import { addWatchRule, removeWatchRule, unwatchModel } from "@/db/queries/watches";
import { MAIL_DELIVERIES, MODEL_KINDS } from "@/db/schema";
import { requireAction } from "@/server/context";

function text(form: FormData, name: string): string {
  const v = form.get(name);
  return typeof v === "string" ? v : "";
}

const Delivery = z.enum(MAIL_DELIVERIES, { message: "Choose how the mail should come." });
const NewWatch = z.discriminatedUnion("scope", [
  z.object({ scope: z.literal("class"), modelKind: z.enum(MODEL_KINDS, { message: "Choose a kind of model." }) }),
  z.object({ scope: z.literal("onto"), modelId: z.string().min(1, "Choose a model.").max(200) }),
  z.object({ scope: z.literal("lumping-of"), modelId: z.string().min(1, "Choose a chain.").max(200) }),
]);

export async function markAllReadAction(): Promise<void> {
  const { user, workspace } = await requireAction("atlas:read");
  await markNotificationsRead({ workspaceId: workspace.id, userId: user.id });
  revalidatePath("/", "layout");
}

export async function setDeliveryAction(_prev: FormState, form: FormData): Promise<FormState> {
  const { user, workspace } = await requireAction("watch:manage");
  const parsed = Delivery.safeParse(text(form, "delivery"));
  if (!parsed.success) return { status: "error", message: parsed.error.issues[0].message };
  await setMailDelivery({ workspaceId: workspace.id, userId: user.id, delivery: parsed.data });
  revalidatePath("/notifications");
  const said = { immediate: "You get one mail per certified or retracted map you watch.", digest: "You get one digest mail a day.", off: "You get no watch mail; notifications still appear here." };
  return { status: "ok", message: said[parsed.data] };
}

export async function addWatchAction(_prev: FormState, form: FormData): Promise<FormState> {
  const { user, workspace } = await requireAction("watch:manage");
  const scope = text(form, "scope");
  const parsed = NewWatch.safeParse(scope === "class" ? { scope, modelKind: text(form, "modelKind") } : { scope, modelId: text(form, "modelId") });
  if (!parsed.success) return { status: "error", message: parsed.error.issues[0].message };
  const rule = await addWatchRule({
    workspaceId: workspace.id,
    userId: user.id,
    scope: parsed.data.scope,
    modelKind: parsed.data.scope === "class" ? parsed.data.modelKind : null,
    modelId: parsed.data.scope === "class" ? null : parsed.data.modelId,
  });
  if (!rule) return { status: "error", message: "That model is not in this workspace." };
  revalidatePath("/notifications");
  return { status: "ok", message: "Watching." };
}

export async function removeWatchAction(_prev: FormState, form: FormData): Promise<FormState> {
  const { user, workspace } = await requireAction("watch:manage");
  const id = z.string().min(1).max(200).safeParse(text(form, "id"));
  if (!id.success) return { status: "error", message: "Choose a watch." };
  const removed =
    text(form, "scope") === "model"
      ? await unwatchModel({ workspaceId: workspace.id, userId: user.id, modelId: text(form, "modelId") })
      : await removeWatchRule({ workspaceId: workspace.id, userId: user.id, id: id.data });
  if (!removed) return { status: "error", message: "That watch was already gone." };
  revalidatePath("/notifications");
  return { status: "ok", message: "Stopped watching." };
}
