import tseslint from "typescript-eslint";
import nextPlugin from "@next/eslint-plugin-next";

export default tseslint.config(
  {
    ignores: ["node_modules/**", ".next/**", ".next-*/**", ".data/**", ".run/**", "next-env.d.ts", "playwright-report/**", "test-results/**", "migrations/**", "seeders/**", "config/**", "models/**/*.cjs", ".sequelizerc"],
  },
  ...tseslint.configs.recommended,
  {
    plugins: { "@next/next": nextPlugin },
    rules: {
      ...nextPlugin.configs.recommended.rules,
      "@typescript-eslint/no-explicit-any": "error",
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "@typescript-eslint/ban-ts-comment": "error",
      "no-restricted-imports": ["error", { paths: [{ name: "@/models", message: "Import models from @/lib/server/models (it initialises them on the connection pool)." }] }],
    },
  },
  {
    files: ["lib/server/db.ts", "lib/server/models.ts", "models/**"],
    rules: { "no-restricted-imports": "off" },
  },
  {
    files: ["**/*.mjs", "**/*.cjs"],
    languageOptions: { globals: { process: "readonly", console: "readonly", URL: "readonly" } },
    rules: { "@typescript-eslint/no-require-imports": "off" },
  },
);
