import { certificateJsonSchema } from "@/lib/certificate";
import { route } from "../../_lib/handler";

// The schema is a constant of the build: converting it from zod on every request cost more than
// the rest of the request (z.toJSONSchema per call), so its JSON text is made once.
let body: string | null = null;

export const GET = route(async () => {
  body ??= JSON.stringify(certificateJsonSchema());
  return new Response(body, { headers: { "content-type": "application/json" } });
});
