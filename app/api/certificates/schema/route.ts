import { certificateJsonSchema } from "@/lib/certificate";
import { route } from "../../_lib/handler";

export const GET = route(async () => Response.json(certificateJsonSchema()));
