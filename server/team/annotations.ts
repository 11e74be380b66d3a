import "server-only";
import { addAnnotation, type AnnotationKind } from "@/db/queries/notes";
import type { Action } from "@/lib/policy";
import { parseReference } from "@/lib/references";
import { AppError } from "@/server/errors";

/** The policy action each kind of annotation needs. */
export const ANNOTATION_ACTION: Record<AnnotationKind, Action> = {
  note: "annotation:note",
  tag: "annotation:tag",
  published: "map:mark-published",
};

const TAG = /^[a-z0-9][a-z0-9-]{0,39}$/;

/** Checks and normalises the text of an annotation; a bad one is a 400 on `text`. */
export function normaliseAnnotation(kind: AnnotationKind, subjectType: "model" | "map", raw: string): string {
  const text = raw.trim();
  if (kind === "note") {
    if (text.length === 0 || text.length > 1000) throw new AppError("bad_input", "Write a note of 1 to 1000 characters.", { field: "text" });
    return text;
  }
  if (kind === "tag") {
    const tag = text.toLowerCase();
    if (!TAG.test(tag)) throw new AppError("bad_input", "A tag is 1 to 40 lower-case letters, digits or hyphens, e.g. “additive” or “class-3”.", { field: "text" });
    return tag;
  }
  if (subjectType !== "map") throw new AppError("bad_input", "Only a map can be marked as published.", { field: "subjectType" });
  const ref = parseReference(text);
  if (!ref)
    throw new AppError("bad_input", "Give a DOI (10.<registrant>/<suffix>, e.g. 10.1103/PhysRevE.73.026203) or an arXiv identifier (e.g. 1501.00001 or hep-th/9901001).", { field: "text" });
  return `${ref.scheme}:${ref.id}`;
}

export async function annotate(input: { workspaceId: string; subjectType: "model" | "map"; subjectId: string; kind: AnnotationKind; text: string; authorId: string }): Promise<{ id: string }> {
  const text = normaliseAnnotation(input.kind, input.subjectType, input.text);
  const row = await addAnnotation({ ...input, text });
  if (!row) throw new AppError("not_found", `No ${input.subjectType} ${input.subjectId} in this workspace.`, { field: "subjectId" });
  return row;
}
