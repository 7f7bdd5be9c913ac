import { spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import path from "node:path";

/** Node arguments that run the production server (src/cli/serve.ts); `npm start`, tests and benches use them. */
export const SERVE_ARGS = ["--conditions=react-server", "--import", "tsx", "src/cli/serve.ts"];

/** Runs `next build` when there is no production build yet; exits the process if the build fails. */
export function buildIfNeeded(env: NodeJS.ProcessEnv = process.env) {
  if (existsSync(".next/BUILD_ID")) return;
  console.log("No production build yet: running next build…");
  const nextBin = path.resolve("node_modules/next/dist/bin/next");
  const result = spawnSync(process.execPath, [nextBin, "build"], { stdio: "inherit", env: { ...env, NEXT_TELEMETRY_DISABLED: "1" } });
  if (result.status !== 0) process.exit(result.status ?? 1);
}
