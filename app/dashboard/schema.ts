import { z } from "zod";

/** A note in the workspace log; the dashboard form and POST /api/notes share it. */
export const NoteInput = z.object({
  text: z.string().trim().min(1, "Write a note first.").max(500, "Keep a note under 500 characters."),
});
