import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

const root = fileURLToPath(new URL(".", import.meta.url));

export default defineConfig({
  resolve: {
    alias: {
      "@/": `${root}/`,
      // Route handlers and query modules import "server-only"; in tests they run on the server.
      "server-only": `${root}/tests/support/server-only.ts`,
    },
  },
  test: {
    coverage: {
      provider: "v8",
      include: ["lib/clinical/**/*.ts"],
      reporter: ["text-summary", "text"],
      thresholds: { lines: 95 },
    },
    projects: [
      {
        extends: true,
        // Property tests run hundreds of cases; a loaded machine must not make them time out.
        test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node", testTimeout: 60_000 },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          // One database per run (made by scripts/test.ts or the global setup), copied per file.
          fileParallelism: false,
          globalSetup: ["tests/integration/global-setup.ts"],
          setupFiles: ["tests/integration/per-file-database.ts"],
          // Generous: sign-ins hash passwords (scrypt), slow on a loaded two-core machine.
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 90_000,
          hookTimeout: 90_000,
        },
      },
    ],
  },
});
