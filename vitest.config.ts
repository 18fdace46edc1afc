import { defineConfig } from "vitest/config";
import path from "node:path";

// Two projects: pure unit tests (engine, components) and integration tests
// that talk to the real PostgreSQL started by scripts/test.sh.
export default defineConfig({
  resolve: { alias: { "~": path.resolve(import.meta.dirname, "app") } },
  test: {
    projects: [
      {
        // Inherits the root config (the "~" alias of app/).
        extends: true,
        test: {
          name: "unit",
          include: ["test/unit/**/*.test.{ts,tsx}", "app/**/*.test.{ts,tsx}"],
          setupFiles: ["test/support/dom-timeouts.ts"],
          environment: "node",
          // A test's own time is never a measure here (npm run bench is): room for a loaded CI machine.
          testTimeout: 30_000,
        },
      },
      {
        // Inherits the root config (the "~" alias of app/).
        extends: true,
        test: {
          name: "integration",
          include: ["test/integration/**/*.test.ts"],
          // Every answer of /api/v1 is checked against its schema (test/support/answers.ts).
          setupFiles: ["test/support/check-answers.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        // Stops and starts the test database: run on its own, after the integration tests.
        extends: true,
        test: {
          name: "fault",
          include: ["test/fault/**/*.test.ts"],
          setupFiles: ["test/support/check-answers.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 60_000,
        },
      },
    ],
  },
});
