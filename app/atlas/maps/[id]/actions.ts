"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import type { RetractState } from "@/components/atlas/retract-form";
import { getCertificate, getMap, retractMap } from "@/db/queries/atlas";
import { recordCertificateCheck } from "@/db/queries/maps";
import { runVerification } from "@/server/atlas/pool";
import { isAppError } from "@/server/errors";
import { requireAction } from "@/server/context";
import { checkReason } from "@/components/atlas/checkWords";

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
  return { status: "ok", message: "The map is retracted; everyone who watches it or its models will be told." };
}

export type ReverifyState = { status: "idle" | "ok" | "error"; message?: string };

/**
 * Checks the map's stored certificate again with the core's checker, in a verification worker
 * thread within the server's bounds, and records the result and date beside the map.
 */
export async function reverifyMapAction(mapId: string, _state: ReverifyState): Promise<ReverifyState> {
  const { workspace, user } = await requireAction("atlas:read");
  const map = await getMap({ workspaceId: workspace.id, mapId });
  const certificate = map ? await getCertificate({ address: map.certificateAddress }) : null;
  if (!map || !certificate) return { status: "error", message: "This map is not in the current workspace." };
  let status: string;
  let checkerVersion: string | null = null;
  try {
    const outcome = await runVerification({ op: "verify", certificate: JSON.parse(certificate.body) as unknown });
    status = outcome.status === "holds" && outcome.address === certificate.address ? "holds" : outcome.status;
    if (outcome.status === "holds") checkerVersion = outcome.checkerVersion;
  } catch (err) {
    status = isAppError(err) && err.code === "too_large" ? "too-large" : "error";
  }
  await recordCertificateCheck({ workspaceId: workspace.id, mapId, userId: user.id, status, checkerVersion });
  revalidatePath(`/atlas/maps/${mapId}`);
  return status === "holds"
    ? { status: "ok", message: "Verified again: the square commutes." }
    : { status: "error", message: `The check did not confirm the certificate: ${checkReason(status)}.` };
}
