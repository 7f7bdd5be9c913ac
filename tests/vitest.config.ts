import path from "node:path";
import { defineConfig } from "vitest/config";

const root = path.resolve(import.meta.dirname, "..");

export default defineConfig({
  root,
  resolve: {
    alias: {
      "@": path.join(root, "src"),
      // The marker package throws outside React Server Components; tests call server code directly.
      "server-only": path.join(root, "tests/support/empty.ts"),
    },
  },
  test: {
    environment: "node",
    include: ["src/**/*.test.ts", "tests/integration/**/*.test.ts", "tests/support/**/*.test.ts"],
    setupFiles: [path.join(root, "tests/support/fresh-database.ts")],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: "forks",
  },
});
