import { z } from "zod";
import { NoteInput } from "@/app/dashboard/schema";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../_lib/doc";

/** The dashboard form and this route share one note schema. */
export const CreateBody = NoteInput.meta({ id: "CreateNoteRequest" });

const ActivityOut = z.object({
  id: z.string(),
  action: z.string().meta({ description: "`note:post`, `map:certify`, `map:retract`, …" }),
  subjectType: z.string(),
  subjectId: z.string(),
  detail: z.record(z.string(), z.unknown()),
  actorName: z.string().nullable(),
  createdAt: z.string(),
});

export const LogOut = z
  .object({ notes: z.number().int().meta({ description: "Notes in the workspace log." }), items: z.array(ActivityOut) })
  .meta({ id: "WorkspaceLog" });

export const NoteOut = z.object({ id: z.string() }).meta({ id: "CreatedNote" });

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/notes",
    summary: "The workspace log: the newest 50 events (notes, certified maps, retractions) and the number of notes",
    tags: ["notes"],
    security: SECURITY,
    responses: { 200: jsonBody(LogOut, "The log."), ...errorResponses("unauthenticated", "forbidden") },
  },
  {
    method: "post",
    path: "/api/notes",
    summary: "Add a note to the workspace log",
    tags: ["notes"],
    security: SECURITY,
    request: { body: jsonBody(CreateBody, "The note.") },
    responses: { 201: jsonBody(NoteOut, "The note."), ...errorResponses("bad_input", "unauthenticated", "forbidden", "unsupported_media_type") },
  },
];
