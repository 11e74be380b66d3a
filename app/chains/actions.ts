"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import type { ChainActionState } from "@/components/chain-editor/types";
import { can, refusalReason } from "@/lib/policy";
import { submitChain } from "@/server/atlas/submit";
import { isAppError } from "@/server/errors";
import { getWorkspaceContext } from "@/server/context";

const ChainForm = z.object({
  name: z.string().trim().min(1, "Give the chain a name.").max(200, "Keep the name under 200 characters."),
  mapIds: z.array(z.string().min(1).max(100)).min(1, "Add at least one certified map.").max(32, "A chain has at most 32 links."),
});

/** The link a server refusal is about: `details.link`, or a field such as "mapIds.2". */
function linkOf(err: { field?: string; details?: unknown }): number | null {
  const details = err.details as { link?: unknown } | undefined;
  if (details && typeof details.link === "number") return details.link;
  const match = /(?:^|\.)mapIds\.(\d+)/.exec(err.field ?? "");
  return match ? Number(match[1]) : null;
}

/**
 * Stores a chain after the server has re-verified it. Session and role are checked here, not only
 * by the page that shows the form.
 */
export async function submitChainAction(_state: ChainActionState, form: FormData): Promise<ChainActionState> {
  const { workspace, user, role } = await getWorkspaceContext();
  if (!can(role, "chain:submit")) return { status: "error", message: refusalReason(role, "chain:submit"), link: null };

  const parsed = ChainForm.safeParse({ name: form.get("name") ?? "", mapIds: form.getAll("mapId").map(String) });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = issue.path[0] === "name" ? "name" : "links";
    return { status: "error", message: issue.message, link: null, field };
  }

  let chainId: string;
  try {
    const result = await submitChain({ workspaceId: workspace.id, userId: user.id, name: parsed.data.name, mapIds: parsed.data.mapIds });
    chainId = result.chainId;
  } catch (err) {
    if (isAppError(err)) return { status: "error", message: err.message, link: linkOf(err) };
    throw err;
  }
  revalidatePath("/chains");
  redirect(`/chains/${chainId}`);
}
