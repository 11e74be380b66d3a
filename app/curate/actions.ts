"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import type { FormState } from "@/components/ui/form-state";
import { ANNOTATION_KINDS } from "@/db/schema";
import { can, refusalReason } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";
import { isAppError } from "@/server/errors";
import { ANNOTATION_ACTION, annotate } from "@/server/team/annotations";

const Input = z.object({
  subjectType: z.enum(["model", "map"]),
  subjectId: z.string().min(1).max(200),
  kind: z.enum(ANNOTATION_KINDS, { message: "Choose note, tag or published in." }),
  text: z.string().max(1000, "Use at most 1000 characters."),
});

/** Adds a note, tag or reference; the role is checked for the kind asked for. */
export async function annotateAction(_prev: FormState<"text" | "kind">, form: FormData): Promise<FormState<"text" | "kind">> {
  const { user, workspace, role } = await getWorkspaceContext();
  const raw = Object.fromEntries(["subjectType", "subjectId", "kind", "text"].map((k) => [k, String(form.get(k) ?? "")]));
  const values = { text: raw.text, kind: raw.kind };
  const parsed = Input.safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { status: "error", fieldErrors: { [issue.path[0] === "kind" ? "kind" : "text"]: [issue.message] }, values };
  }
  const action = ANNOTATION_ACTION[parsed.data.kind];
  if (!can(role, action)) return { status: "error", message: refusalReason(role, action), values };
  try {
    await annotate({ workspaceId: workspace.id, authorId: user.id, ...parsed.data });
  } catch (err) {
    if (isAppError(err) && err.field === "text") return { status: "error", fieldErrors: { text: [err.message] }, values };
    if (isAppError(err)) return { status: "error", message: err.message, values };
    throw err;
  }
  revalidatePath(`/atlas/${parsed.data.subjectType === "map" ? "maps" : "models"}/${parsed.data.subjectId}`);
  return { status: "ok", message: "Added." };
}
