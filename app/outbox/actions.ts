"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import type { FormState } from "@/components/ui/form-state";
import { resendOutboxMessage } from "@/db/queries/outbox";
import { requireAction } from "@/server/context";

/** An admin puts a failed message of the workspace back in the queue. */
export async function resendMessageAction(_prev: FormState, form: FormData): Promise<FormState> {
  const { workspace } = await requireAction("outbox:manage");
  const id = z.string().min(1).max(200).safeParse(form.get("id"));
  if (!id.success) return { status: "error", message: "Choose a message." };
  if (!(await resendOutboxMessage({ workspaceId: workspace.id, id: id.data }))) return { status: "error", message: "Only a failed message can be sent again." };
  revalidatePath("/outbox");
  return { status: "ok", message: "Queued again; it goes out within a few seconds." };
}
