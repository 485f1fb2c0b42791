import tseslint from "typescript-eslint";
import reactHooks from "eslint-plugin-react-hooks";

export default tseslint.config(
  { ignores: [".next/**", "node_modules/**", ".data/**", "test-results/**", "db/migrations/**", "next-env.d.ts"] },
  ...tseslint.configs.recommended,
  {
    files: ["**/*.tsx", "**/*.ts"],
    plugins: { "react-hooks": reactHooks },
    rules: {
      "react-hooks/rules-of-hooks": "error",
      "react-hooks/exhaustive-deps": "warn",
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
    },
  },
  {
    // Domain code stays pure: no React, no database, no Next.js.
    files: ["lib/musicxml/**/*.ts", "lib/analysis/**/*.ts"],
    rules: {
      "no-restricted-imports": ["error", { patterns: ["react", "react-dom", "next", "next/*", "@/db/*", "pg", "drizzle-orm", "drizzle-orm/*"] }],
    },
  },
);
