import { z } from "zod";

export const ExportQuery = z.strictObject({
  format: z.enum(["json", "graphml"]).default("json"),
});
