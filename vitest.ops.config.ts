/**
 * `npm run test:ops`: the scripted fault tests under tests/ops, each against real `next start`
 * servers (built app required: `npx next build`, or HEATBOOK_OPS_APP_DIR pointing at a built
 * checkout) and an embedded PostgreSQL of its own. One file at a time; generous timeouts.
 */
import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

export default defineConfig({
  resolve: { alias: { "@": fileURLToPath(new URL("./", import.meta.url)) } },
  test: {
    setupFiles: ["tests/helpers/repoBoundary.ts"],
    include: ["tests/ops/**/*.test.ts", "tests/**/*.ops.test.ts"],
    testTimeout: 240_000,
    hookTimeout: 240_000,
    pool: "forks",
    fileParallelism: false,
    maxWorkers: 1,
  },
});
