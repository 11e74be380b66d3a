"use server";

import { cookies } from "next/headers";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { WORKSPACE_COOKIE, listMyWorkspaces, requireUser } from "@/server/context";

const SwitchInput = z.object({ workspaceId: z.string().min(1).max(100) });

/** Remembers the chosen workspace, but only one the person is a member of. */
export async function switchWorkspace(form: FormData): Promise<void> {
  await requireUser();
  const parsed = SwitchInput.safeParse({ workspaceId: form.get("workspaceId") });
  if (!parsed.success) return;
  const mine = await listMyWorkspaces();
  if (!mine.some((w) => w.id === parsed.data.workspaceId)) return;
  (await cookies()).set(WORKSPACE_COOKIE, parsed.data.workspaceId, {
    httpOnly: true,
    sameSite: "lax",
    path: "/",
    maxAge: 60 * 60 * 24 * 365,
  });
  revalidatePath("/", "layout");
}
