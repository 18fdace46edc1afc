import { defineConfig, devices } from "@playwright/test";

// Debian's Chromium (apt package `chromium`), never a downloaded browser build.
export default defineConfig({
  testDir: "test/e2e",
  timeout: 60_000,
  expect: { timeout: 10_000 },
  fullyParallel: false,
  workers: 1,
  retries: 0,
  reporter: [["list"], ["json"]],
  use: {
    baseURL: process.env.BASE_URL ?? "http://127.0.0.1:3100",
    trace: "off",
    screenshot: "only-on-failure",
    launchOptions: {
      executablePath: "/usr/bin/chromium",
      args: [
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-background-networking",
        "--disable-quic",
        "--no-first-run",
        "--disable-component-update",
        "--disable-sync",
      ],
    },
  },
  outputDir: ".data/test-results/e2e-artifacts",
  projects: [{ name: "chromium", use: { ...devices["Desktop Chrome"] } }],
});
