import path from "node:path";
import { defineConfig, devices } from "@playwright/test";

const root = path.resolve(import.meta.dirname, "..");
const port = Number(process.env.E2E_PORT || 3100);
// One fresh database per run; workers inherit the name through the environment.
process.env.GRAINLINE_E2E_DB ??= path.join(root, "tests/.tmp", `e2e-${Date.now()}.db`);

export const CHROMIUM_ARGS = ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"];

export default defineConfig({
  testDir: path.join(root, "tests/e2e"),
  outputDir: path.join(root, "test-results"),
  timeout: 60_000,
  expect: { timeout: 10_000 },
  fullyParallel: false,
  workers: 2,
  retries: 0,
  reporter: process.env.CI ? [["list"]] : [["list"]],
  use: {
    baseURL: `http://localhost:${port}`,
    trace: "retain-on-failure",
    launchOptions: { executablePath: process.env.CHROMIUM_PATH || "/usr/bin/chromium", args: CHROMIUM_ARGS },
  },
  // English unless a spec says otherwise (`test.use({ locale: "ja-JP" })`): the app itself defaults to Japanese.
  projects: [{ name: "chromium", use: { ...devices["Desktop Chrome"], channel: undefined, locale: "en-US" } }],
  webServer: {
    // The production server, started the way `npm start` starts it, on a fresh database.
    command: "npx tsx --conditions=react-server src/cli/start.ts",
    cwd: root,
    url: `http://localhost:${port}/sign-in`,
    timeout: 300_000,
    reuseExistingServer: false,
    stdout: "pipe",
    env: { PORT: String(port), GRAINLINE_DB: process.env.GRAINLINE_E2E_DB, GRAINLINE_SEED: "demo", NEXT_TELEMETRY_DISABLED: "1" },
  },
});
