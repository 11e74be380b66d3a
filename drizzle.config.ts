import { defineConfig } from "drizzle-kit";

// drizzle-kit reads only process.env; the default matches env.ts.
export default defineConfig({
  schema: "./db/schema.ts",
  out: "./drizzle",
  dialect: "turso",
  dbCredentials: {
    url: process.env.DATABASE_URL ?? "file:data/squarely.db",
    authToken: process.env.DATABASE_AUTH_TOKEN,
  },
});
