import tseslint from "typescript-eslint";
import nextPlugin from "@next/eslint-plugin-next";

/**
 * The engines are pure (DEVELOPERS.md): nothing from Next, React, the database, models,
 * server or UI code. One list, used for static imports (no-restricted-imports) and for
 * import() calls (no-restricted-syntax); tests/unit/lint proves it bites.
 */
export const ENGINE_FILES = ["lib/doe/**", "lib/stats/**", "lib/surface/**", "lib/chemistry/**", "lib/hazards/**"];
const ENGINE_FORBIDDEN = [
  { regex: "^(next|next-auth|react|react-dom|sequelize|sequelize-cli|pg|pg-hstore|pg-boss|graphile-worker|nodemailer|server-only)(/.*)?$", message: "Engines are pure: no framework, database, mail or server-only package." },
  { regex: "^(@/|(\\.{1,2}/)+)models(/.*)?$", message: "Engines are pure: no models (the caller reads the database and passes plain data)." },
  { regex: "^(@/lib/|(\\.{1,2}/)+(lib/)?)(server|auth|api|hooks|client)(/.*)?$", message: "Engines are pure: no server, auth, API or client code." },
  { regex: "^(@/|(\\.{1,2}/)+)(app|components)(/.*)?$", message: "Engines are pure: no routes or UI components." },
  { regex: "^(@/|(\\.{1,2}/)+)(lib/)?[^/]+/server(/.*)?$", message: "Engines are pure: no domain server operations (lib/*/server, inventory/server)." },
  { regex: "^\\./server(/.*)?$", message: "Engines are pure: no server operations." },
];
const engineImportSelector = (regex) => `ImportExpression[source.value=/${regex.replace(/\//g, "\\/")}/]`;

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
    files: ENGINE_FILES,
    ignores: ["lib/*/server/**"],
    rules: {
      "no-restricted-imports": ["error", { patterns: ENGINE_FORBIDDEN.map((f) => ({ regex: f.regex, message: f.message })) }],
      "no-restricted-syntax": [
        "error",
        ...ENGINE_FORBIDDEN.map((f) => ({ selector: engineImportSelector(f.regex), message: f.message })),
        { selector: "CallExpression[callee.name='require']", message: "Engines are ES modules: no require()." },
      ],
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
