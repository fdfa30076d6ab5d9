import { defineConfig } from "@playwright/test";

const PORT = Number(process.env.E2E_PORT ?? 3100);

export default defineConfig({
  testDir: "e2e",
  timeout: 60_000,
  expect: { timeout: 10_000 },
  workers: 1,
  retries: process.env.CI ? 1 : 0,
  reporter: [["list"], ["json"]],
  use: {
    baseURL: `http://localhost:${PORT}`,
    screenshot: "only-on-failure",
    trace: "retain-on-failure",
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    },
  },
  webServer: {
    command: `node node_modules/tsx/dist/cli.mjs scripts/start.ts --port ${PORT} --data-dir .data/e2e --fresh --no-build --no-worker`,
    url: `http://localhost:${PORT}/signin`,
    timeout: 240_000,
    reuseExistingServer: false,
    stdout: "pipe",
    env: { NEXTAUTH_URL: `http://localhost:${PORT}`, HEATBOOK_BCRYPT_COST: "4" },
  },
});
