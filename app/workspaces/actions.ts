"use server";

import { cookies } from "next/headers";
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { fieldErrorsOf, type FormState } from "@/components/ui/form-state";
import { createWorkspace, setPublicView } from "@/db/queries/workspaces";
import { WORKSPACE_COOKIE, requireAction, requireUser } from "@/server/context";

const NewWorkspace = z.object({ name: z.string().trim().min(1, "Name the workspace.").max(100, "Use at most 100 characters.") });

/** Anyone signed in creates a workspace, becomes its admin, and is taken there. */
export async function createWorkspaceAction(_prev: FormState<"name">, form: FormData): Promise<FormState<"name">> {
  const user = await requireUser();
  const raw = form.get("name");
  const values = { name: typeof raw === "string" ? raw : "" };
  const parsed = NewWorkspace.safeParse(values);
  if (!parsed.success) return { status: "error", fieldErrors: fieldErrorsOf<"name">(parsed.error.issues), values };
  let id: string;
  try {
    id = (await createWorkspace({ userId: user.id, name: parsed.data.name })).id;
  } catch {
    return { status: "error", message: "The workspace could not be created just now; nothing was saved.", values };
  }
  (await cookies()).set(WORKSPACE_COOKIE, id, { httpOnly: true, sameSite: "lax", path: "/", maxAge: 60 * 60 * 24 * 365 });
  revalidatePath("/", "layout");
  redirect("/dashboard");
}

/** An admin turns the public read-only view on or off. */
export async function setPublicViewAction(_prev: FormState, form: FormData): Promise<FormState> {
  const { user, workspace } = await requireAction("workspace:publish");
  const on = form.get("publicView") === "on";
  await setPublicView({ workspaceId: workspace.id, on, actorId: user.id });
  revalidatePath("/members");
  return { status: "ok", message: on ? "The public view is on." : "The public view is off." };
}
