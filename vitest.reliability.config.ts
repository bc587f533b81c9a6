import { defineConfig } from "vitest/config";
import path from "node:path";
import { RELIABILITY_ENV } from "./tests/reliability/support/reliability-env";

const alias = { "@": path.resolve(__dirname), "server-only": path.resolve(__dirname, "tests/support/server-only-stub.ts") };

// The fault suite (npm run test:reliability): connections cut, the upload server killed, PostgreSQL
// crashed and Redis restarted empty, against a PostgreSQL and a Redis of its own (never the shared ones).
export default defineConfig({
  resolve: { alias },
  test: {
    name: "reliability",
    env: RELIABILITY_ENV,
    include: ["tests/reliability/**/*.test.ts"],
    environment: "node",
    globalSetup: ["tests/reliability/support/global-setup.ts"],
    testTimeout: 240_000,
    hookTimeout: 240_000,
    fileParallelism: false,
  },
});
