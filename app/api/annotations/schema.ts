import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "@/app/api/_lib/doc";
import { ANNOTATION_KINDS } from "@/db/schema";

const SubjectType = z.enum(["model", "map"], { message: "Choose model or map." });
export const AnnotationQuery = z.object({ subjectType: SubjectType, subjectId: z.string().min(1).max(200) });
export const AnnotationBody = z
  .object({
    subjectType: SubjectType,
    subjectId: z.string().min(1).max(200),
    kind: z.enum(ANNOTATION_KINDS, { message: `Choose one of ${ANNOTATION_KINDS.join(", ")}.` }),
    text: z.string().max(1000, "Use at most 1000 characters."),
  })
  .meta({ id: "Annotation", description: "A note, a tag, or (maps only) a “published in” DOI or arXiv identifier, checked by syntax only." });

const AnnotationOut = z.object({ id: z.string(), kind: z.enum(ANNOTATION_KINDS), text: z.string(), authorName: z.string().nullable(), createdAt: z.string() });

export const annotationRoutes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/annotations",
    summary: "Notes, tags and references on a model or map",
    tags: ["curating"],
    security: SECURITY,
    request: { query: AnnotationQuery },
    responses: { 200: jsonBody(z.object({ items: z.array(AnnotationOut) }), "Oldest first"), ...errorResponses("bad_input", "unauthenticated", "forbidden") },
  },
  {
    method: "post",
    path: "/api/annotations",
    summary: "Add a note or tag (contributors and up), or mark a map published in a DOI or arXiv paper",
    tags: ["curating"],
    security: SECURITY,
    request: { body: jsonBody(AnnotationBody, "What to add") },
    responses: { 201: jsonBody(z.object({ id: z.string() }), "Added"), ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found") },
  },
];
