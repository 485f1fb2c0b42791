import path from "node:path";
import react from "@vitejs/plugin-react";
import { defineConfig } from "vitest/config";

const alias = { "@": path.resolve(import.meta.dirname) };
// `server-only` throws outside a React server bundle; in tests the module is plain code.
const serverOnly = { "server-only": path.resolve(import.meta.dirname, "tests/helpers/server-only-stub.ts") };

export default defineConfig({
  test: {
    projects: [
      {
        resolve: { alias: { ...alias, ...serverOnly } },
        test: {
          name: "unit",
          environment: "node",
          include: ["lib/**/*.test.ts", "db/**/*.test.ts", "scripts/**/*.test.ts", "tests/unit/**/*.test.ts"],
        },
      },
      {
        plugins: [react()],
        resolve: { alias: { ...alias, ...serverOnly } },
        test: {
          name: "components",
          environment: "jsdom",
          include: ["components/**/*.test.tsx", "app/**/*.test.tsx"],
        },
      },
      {
        resolve: { alias: { ...alias, ...serverOnly } },
        test: {
          name: "integration",
          environment: "node",
          include: ["tests/integration/**/*.test.ts"],
          testTimeout: 30_000,
          hookTimeout: 60_000,
          fileParallelism: false,
        },
      },
      {
        resolve: { alias: { ...alias, ...serverOnly } },
        test: {
          name: "e2e",
          environment: "node",
          include: ["tests/e2e/**/*.e2e.ts"],
          testTimeout: 120_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
