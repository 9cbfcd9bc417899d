// ESLint 9 flat config: TypeScript, Next.js, React hooks, and Drizzle's guard against
// an update or delete without `.where(…)`.
import nextPlugin from "@next/eslint-plugin-next";
import drizzle from "eslint-plugin-drizzle";
import reactHooks from "eslint-plugin-react-hooks";
import tseslint from "typescript-eslint";

/**
 * Our code reaches the database as `db()` (a call) or `tx` (a transaction). The Drizzle
 * plugin matches both: a member `.delete`/`.update` on an identifier, or on a call of
 * an identifier, named in drizzleObjectName (proved in tests/unit/eslint-drizzle.test.ts).
 */
export const drizzleRules = {
  "drizzle/enforce-delete-with-where": ["error", { drizzleObjectName: ["db", "tx"] }],
  "drizzle/enforce-update-with-where": ["error", { drizzleObjectName: ["db", "tx"] }],
};

export default tseslint.config(
  {
    ignores: [
      ".next/**",
      "node_modules/**",
      ".data/**",
      "drizzle/**",
      "next-env.d.ts",
      "tests/.artifacts/**",
      "bench/.out/**",
      "test-results/**",
    ],
  },
  ...tseslint.configs.recommended,
  {
    files: ["**/*.{ts,tsx,mts,mjs}"],
    plugins: { "@next/next": nextPlugin, "react-hooks": reactHooks, drizzle },
    rules: {
      ...nextPlugin.configs.recommended.rules,
      ...nextPlugin.configs["core-web-vitals"].rules,
      ...reactHooks.configs.flat["recommended-latest"].rules,
      ...drizzleRules,
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none" }],
    },
  },
  {
    // Scripts and tests run in Node outside Next: the page-only Next rules do not apply.
    files: ["scripts/**", "tests/**", "bench/**", "*.config.*"],
    rules: { "@next/next/no-html-link-for-pages": "off" },
  },
);
