"use server";

import { revalidatePath } from "next/cache";
import { createNote } from "@/db/queries/notes";
import { fieldErrorsOf, type FormState } from "@/components/ui/form-state";
import { requireAction } from "@/server/context";
import { NoteInput } from "./schema";

/** A contributor adds a line to the workspace log. The role is checked here, not only in the page. */
export async function postNoteAction(_prev: FormState<"text">, form: FormData): Promise<FormState<"text">> {
  const { user, workspace } = await requireAction("note:post");
  const raw = form.get("text");
  const parsed = NoteInput.safeParse({ text: typeof raw === "string" ? raw : undefined });
  if (!parsed.success)
    return { status: "error", fieldErrors: fieldErrorsOf<"text">(parsed.error.issues), values: { text: typeof raw === "string" ? raw : "" } };
  try {
    await createNote({ workspaceId: workspace.id, actorId: user.id, text: parsed.data.text });
  } catch {
    return { status: "error", message: "The note could not be saved; nothing was written. Please try again.", values: { text: parsed.data.text } };
  }
  revalidatePath("/dashboard");
  return { status: "ok", message: "Note added to the workspace log." };
}
