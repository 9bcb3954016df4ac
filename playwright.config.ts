import { defineConfig } from "@playwright/test";

/**
 * Browser and API tests. `node scripts/test.mjs e2e` builds and starts the app on a free
 * port and sets E2E_BASE_URL; Chromium is Debian's (/usr/bin/chromium), never downloaded.
 */
const baseURL = process.env.E2E_BASE_URL ?? "http://127.0.0.1:3000";
const executablePath = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

export default defineConfig({
  testDir: "tests/e2e",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  use: { baseURL, trace: "off", screenshot: "only-on-failure" },
  projects: [
    {
      name: "browser",
      testMatch: /.*\.spec\.ts/,
      use: {
        browserName: "chromium",
        viewport: { width: 1280, height: 860 },
        launchOptions: {
          executablePath,
          args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
        },
      },
    },
    { name: "api", testMatch: /.*\.api\.ts/ },
  ],
});
