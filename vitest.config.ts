import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

// The audit key of the test run (tests only; the app reads HEATBOOK_AUDIT_KEY). Set here so the
// global setup and every test process share it.
process.env.HEATBOOK_AUDIT_KEY ??= "test-only-audit-key-0123456789abcdef";

export default defineConfig({
  resolve: { alias: { "@": fileURLToPath(new URL("./", import.meta.url)) } },
  test: {
    setupFiles: ["tests/helpers/repoBoundary.ts"],
    include: ["tests/**/*.test.ts"],
    // tests/ops need built servers of their own: `npm run test:ops` (vitest.ops.config.ts).
    exclude: ["**/node_modules/**", "tests/ops/**", "tests/**/*.ops.test.ts"],
    globalSetup: ["tests/helpers/globalSetup.ts"],
    // Notebook opens wait for their computation (a test that wants "computing" passes waitMs).
    env: { HEATBOOK_COMPUTE_WAIT_MS: "120000" },
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: "forks",
    maxWorkers: 2,
  },
});
