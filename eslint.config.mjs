import tseslint from "typescript-eslint";
import reactHooks from "eslint-plugin-react-hooks";

// The house's direction: app → components → lib (client) and app → server → db → lib.
// Each folder lists what it may not import; a newcomer reads DEVELOPERS.md ("Layout").
const alias = (...folders) => folders.flatMap((f) => [`@/${f}`, `@/${f}/*`]);
const FEATURES = ["score", "sharing", "library", "practice", "assignments", "stand-copy", "auth"];
const restrict = (patterns, message) => ({ "no-restricted-imports": ["error", { patterns: [{ group: patterns, message }] }] });

const LIB = alias("db", "server", "components", "app");
const REACT_NEXT_DB = ["react", "react-dom", "next", "next/*", "pg", "drizzle-orm", "drizzle-orm/*"];

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
    files: ["lib/**/*.ts", "lib/**/*.tsx"],
    rules: restrict(LIB, "lib/ is pure and shared by client and server: it imports neither the database, the server layer, components nor routes."),
  },
  {
    // Domain code stays pure: no React, no database, no Next.js.
    files: ["lib/musicxml/**/*.ts", "lib/analysis/**/*.ts"],
    rules: restrict([...LIB, ...REACT_NEXT_DB], "The reader and the analysis are pure: no React, no Next.js, no database."),
  },
  {
    files: ["db/**/*.ts"],
    rules: restrict(alias("server", "components", "app"), "db/ is data access: it imports lib/ only, never the server layer, components or routes."),
  },
  {
    files: ["server/**/*.ts"],
    rules: restrict(alias("components", "app"), "server/ holds use cases: it imports db/ and lib/, never components or routes."),
  },
  {
    files: ["components/**/*.ts", "components/**/*.tsx"],
    rules: restrict(alias("app", "server", "db"), "Components run in the browser: they import lib/ and other components, never routes, the server layer or the database."),
  },
  {
    files: ["components/ui/**", "components/client/**"],
    rules: restrict(
      [...alias("app", "server", "db", "components/screens"), ...FEATURES.flatMap((f) => alias(`components/${f}`))],
      "Shared pieces (components/ui, components/client) import no feature folder and no screen.",
    ),
  },
  ...FEATURES.map((feature) => ({
    files: [`components/${feature}/**`],
    rules: restrict(
      [...alias("app", "server", "db", "components/screens"), ...FEATURES.filter((f) => f !== feature).flatMap((f) => alias(`components/${f}`))],
      `components/${feature} imports shared pieces (components/ui, components/client, lib/), not another feature: put what two features share in a shared place, and compose features in components/screens.`,
    ),
  })),
);
