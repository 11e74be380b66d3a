import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

const alias = { "@": fileURLToPath(new URL("./", import.meta.url)) };

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: "unit",
          include: ["lib/**/*.test.ts", "cli/**/*.test.ts", "components/**/*.test.ts"],
          environment: "node",
          testTimeout: 60_000,
        },
      },
      {
        resolve: { alias: { ...alias, "server-only": fileURLToPath(new URL("./tests/support/empty.ts", import.meta.url)) } },
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts", "db/**/*.test.ts"],
          environment: "node",
          testTimeout: 120_000,
          fileParallelism: false,
        },
      },
      {
        // End-to-end tests prepare and inspect the temporary database through the query layer too.
        resolve: { alias: { ...alias, "server-only": fileURLToPath(new URL("./tests/support/empty.ts", import.meta.url)) } },
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          testTimeout: 180_000,
          hookTimeout: 600_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
