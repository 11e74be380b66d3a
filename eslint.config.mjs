import js from "@eslint/js";
import tseslint from "typescript-eslint";

export default tseslint.config(
  { ignores: ["node_modules/**", ".next/**", "data/**", "drizzle/**", "next-env.d.ts"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
    },
  },
  {
    // The core stays pure: no React, Next, database or environment.
    files: ["lib/**/*.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            { group: ["react", "react-dom", "next", "next/*", "next-auth", "next-auth/*"], message: "lib/ is framework-free." },
            { group: ["drizzle-orm", "drizzle-orm/*", "@libsql/*", "@/db", "@/db/*", "../db/*"], message: "Only db/ touches the database." },
            { group: ["@/env", "@/app/*", "@/components/*"], message: "lib/ depends on nothing outside itself." },
          ],
        },
      ],
    },
  },
);
