/**
 * `npm run bench:load`: the lot read route and the floor write route under 50 concurrent
 * connections (autocannon), side by side with a bare node:http + better-sqlite3 handler
 * doing the same SQL. Prints requests per second, p99 latency and the ratio.
 * Needs a production build (`npm run build`).
 */
import { execFileSync, spawn } from "node:child_process";
import { mkdirSync, rmSync } from "node:fs";
import http from "node:http";
import path from "node:path";
import autocannon from "autocannon";
import Database from "better-sqlite3";

const root = path.resolve(import.meta.dirname, "..");
const dbFile = path.join(root, "bench/.data/load.db");
const APP = 3170;
const BARE = 3171;
const seconds = Number(process.argv.find((a) => a.startsWith("--seconds="))?.split("=")[1] ?? 10);

function prepareDatabase() {
  mkdirSync(path.dirname(dbFile), { recursive: true });
  for (const s of ["", "-wal", "-shm"]) rmSync(dbFile + s, { force: true });
  execFileSync(process.execPath, [path.join(root, "node_modules/tsx/dist/cli.mjs"), "--conditions=react-server", "src/cli/prepare-db.ts"], { cwd: root, env: { ...process.env, GRAINLINE_DB: dbFile } });
}

async function waitFor(url: string) {
  for (let i = 0; i < 300; i++) {
    try {
      if ((await fetch(url)).status < 500) return;
    } catch {}
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${url} did not come up`);
}

/** The same statements the app runs for these two routes, without the framework around them. */
function bareServer() {
  const db = new Database(dbFile);
  db.pragma("journal_mode = WAL");
  db.pragma("busy_timeout = 5000");
  db.pragma("synchronous = NORMAL");
  const readLot = db.prepare(
    "select l.*, p.name as party_name, f.name as field_name, f.region from lots l join parties p on p.id = l.party_id left join fields f on f.id = l.field_id where l.code = ?",
  );
  const lotId = db.prepare("select id, party_id from lots where code = ?");
  const insertEvent = db.prepare("insert into events (step, at, recorded_at, user_id, party_id, place, reference_doc, note, reason, attributes) values ('measuring', ?, ?, 'user-brewer', 'brewery-kirinoha', '', '', '', '', '{}') returning id");
  const insertInput = db.prepare("insert into event_inputs (event_id, lot_id, quantity, content, use) values (?, ?, 0, 0, 'observe')");
  const insertMeasurement = db.prepare("insert into measurements (event_id, lot_id, name, value, unit) values (?, ?, ?, ?, ?)");
  const write = db.transaction((code: string, value: number) => {
    const lot = lotId.get(code) as { id: number };
    const { id } = insertEvent.get(Date.now(), Date.now()) as { id: number };
    insertInput.run(id, lot.id);
    insertMeasurement.run(id, lot.id, "moisturePct", value, "%");
    return id;
  });
  return http.createServer((req, res) => {
    if (req.method === "GET") {
      const row = readLot.get(decodeURIComponent(req.url!.split("/").pop()!));
      res.writeHead(200, { "content-type": "application/json" }).end(JSON.stringify(row));
      return;
    }
    let body = "";
    req.on("data", (c) => (body += c));
    req.on("end", () => {
      const input = JSON.parse(body);
      const id = write.immediate(input.inputs[0].lot, input.measurements[0].value);
      res.writeHead(201, { "content-type": "application/json" }).end(JSON.stringify({ id, outputs: [] }));
    });
  });
}

async function run(url: string, opts: Partial<autocannon.Options>) {
  const result = await autocannon({ url, connections: 50, duration: seconds, ...opts });
  return { rps: result.requests.average, p99: result.latency.p99, non2xx: result.non2xx, errors: result.errors };
}

const writeBody = JSON.stringify({ step: "measuring", inputs: [{ lot: "P26-0001", quantity: 0 }], measurements: [{ name: "moisturePct", value: 13.4, unit: "%" }] });

prepareDatabase();
const app = spawn(process.execPath, [path.join(root, "node_modules/next/dist/bin/next"), "start", "-p", String(APP)], { cwd: root, env: { ...process.env, GRAINLINE_DB: dbFile, NEXT_TELEMETRY_DISABLED: "1" }, stdio: "ignore" });
try {
  await waitFor(`http://localhost:${APP}/sign-in`);
  const signIn = await fetch(`http://localhost:${APP}/api/auth/sign-in`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ email: "brewer@example.com", password: "grainline-demo" }) });
  const cookie = signIn.headers.get("set-cookie")!.split(";")[0]!;
  const headers = { cookie, "content-type": "application/json" };
  // Warm-up: compile paths, fill caches.
  await run(`http://localhost:${APP}/api/lots/P26-0001`, { duration: 2, headers });
  const appRead = await run(`http://localhost:${APP}/api/lots/P26-0001`, { headers });
  const appWrite = await run(`http://localhost:${APP}/api/events`, { method: "POST", body: writeBody, headers });
  app.kill("SIGTERM");

  const bare = bareServer().listen(BARE);
  const bareRead = await run(`http://localhost:${BARE}/api/lots/P26-0001`, {});
  const bareWrite = await run(`http://localhost:${BARE}/api/events`, { method: "POST", body: writeBody, headers: { "content-type": "application/json" } });
  bare.close();

  const line = (name: string, a: { rps: number; p99: number; non2xx: number }, b: { rps: number; p99: number }) =>
    `${name.padEnd(14)} app ${a.rps.toFixed(0).padStart(6)} req/s  p99 ${String(a.p99).padStart(4)} ms  (non-2xx ${a.non2xx}) | bare ${b.rps.toFixed(0).padStart(6)} req/s  p99 ${String(b.p99).padStart(4)} ms | app/bare ${(a.rps / b.rps).toFixed(2)}`;
  console.log(`50 connections, ${seconds} s each, ${process.platform} ${process.arch}`);
  console.log(line("lot read", appRead, bareRead));
  console.log(line("floor write", appWrite, bareWrite));
  console.log("Goal: app ≥ 0.50 × bare throughput and p99 ≤ 50 ms.");
} finally {
  app.kill("SIGTERM");
}
