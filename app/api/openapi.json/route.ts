import { route } from "../_lib/handler";
import { openApiDocument } from "../_lib/openapi";

export const GET = route(async () => Response.json(openApiDocument()));
