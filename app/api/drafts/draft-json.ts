import type { Draft } from "@/db/schema";

export function draftJson(draft: Draft & { ownerName?: string }, userId: string, withCanvas: boolean) {
  return {
    id: draft.id,
    name: draft.name,
    ownerId: draft.ownerId,
    ownerName: draft.ownerName ?? "",
    shared: draft.shared,
    mine: draft.ownerId === userId,
    ...(withCanvas ? { canvas: JSON.parse(draft.body) as unknown } : {}),
    createdAt: draft.createdAt.toISOString(),
    updatedAt: draft.updatedAt.toISOString(),
  };
}
