/**
 * `npm start`: migrate, seed the demo on an empty database, build if there is no
 * production build, then serve with src/cli/serve.ts (Next.js behind a front door that
 * refuses malformed paths and oversized bodies).
 */
import { spawn } from "node:child_process";
import { DEMO_PASSWORD, DEMO_USERS } from "../server/records/seed";
import { prepareDatabase } from "./prepare-db";
import { buildIfNeeded, SERVE_ARGS } from "./serve-command";

const dbFile = process.env.GRAINLINE_DB || "data/grainline.db";
const port = process.env.PORT || "3000";
const seedMode = process.env.GRAINLINE_SEED || "demo";
const env = { ...process.env, NEXT_TELEMETRY_DISABLED: "1", GRAINLINE_DB: dbFile };

async function prepare() {
  const seeded = await prepareDatabase(dbFile, seedMode === "demo");
  console.log(`Database ${dbFile}: migrated${seeded ? ", demo scenario seeded" : ""}.`);
}

function serve() {
  const server = spawn(process.execPath, SERVE_ARGS, { stdio: "inherit", env: { ...env, PORT: port } });
  const stop = (signal: NodeJS.Signals) => server.kill(signal);
  process.on("SIGINT", stop);
  process.on("SIGTERM", stop);
  server.on("exit", (code) => process.exit(code ?? 0));
  console.log(`\nGrainline is starting on http://localhost:${port}`);
  if (seedMode === "demo") {
    console.log(`Demo logins (password "${DEMO_PASSWORD}"):`);
    for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(8)} ${u.email}`);
  }
}

await prepare();
buildIfNeeded(env);
serve();
