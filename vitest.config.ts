import { defineConfig } from "vitest/config";
import path from "node:path";
import { TEST_ENV } from "./tests/support/test-env";

const alias = { "@": path.resolve(__dirname), "server-only": path.resolve(__dirname, "tests/support/server-only-stub.ts") };

// Three projects: fast pure-logic tests, tests against the real Postgres/Redis/ffmpeg,
// and browser tests driving Debian's chromium against the built app.
export default defineConfig({
  test: {
    projects: [
      { resolve: { alias }, test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node" } },
      {
        resolve: { alias },
        test: {
          name: "integration",
          env: TEST_ENV,
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/support/global-setup.ts"],
          testTimeout: 120_000,
          hookTimeout: 180_000,
          fileParallelism: false,
        },
      },
      {
        resolve: { alias },
        test: {
          name: "e2e",
          env: TEST_ENV,
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/support/global-setup.ts", "tests/support/e2e-setup.ts"],
          testTimeout: 180_000,
          hookTimeout: 240_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
