/**
 * `npm run bench:load`: the lot read route and the floor write route under 50 concurrent
 * connections, side by side with a bare node:http + better-sqlite3 handler running the same
 * SQL (bench/bare-server.ts). Prints requests per second, p99 latency and the ratio for
 * the production server (`npm start`: src/cli/serve.ts, every request through Next's router).
 * Each server runs alone in its own process; the load comes from wrk (Debian's package) when
 * it is installed, else from autocannon in this process. Needs a production build.
 * Options: --seconds=N (default 10), --runs=N (default 3: bare and app take turns; medians reported).
 *
 * Then the open model (bench/open-load.ts): a fixed arrival rate of lot reads and floor writes
 * (70/30) over 100 connections through the production server, with p50/p99 measured from each
 * request's scheduled send time. Options: --open-rates=50,200 (add 300,400 to find where 50 ms
 * goes), --open-seconds=20, --open-runs=3 (one server a rate, a 10 s warm-up, then the runs);
 * --only=closed or --only=open runs one half; --port=N (default 3170).
 */
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { copyFileSync, mkdirSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import autocannon from "autocannon";
import Database from "better-sqlite3";
import { buildIfNeeded, SERVE_ARGS } from "../src/cli/serve-command";
import { openFloor, type OpenRun } from "./open-load";
import { stop, waitFor } from "./server-process";

const root = path.resolve(import.meta.dirname, "..");
const text = (name: string, fallback: string) => process.argv.find((a) => a.startsWith(`--${name}=`))?.split("=")[1] ?? fallback;
const option = (name: string, fallback: number) => Number(text(name, String(fallback)));
const seconds = option("seconds", 10);
const rounds = option("runs", 3);
const only = text("only", "");
const openRates = text("open-rates", "50,200").split(",").map(Number);
const openSeconds = option("open-seconds", 20);
const openRuns = option("open-runs", 3);
const PORT = option("port", 3170);
// Each port has its own files, so two benches on two ports never share a database.
const dataDir = path.join(root, "bench/.data", PORT === 3170 ? "" : String(PORT));
const baseFile = path.join(dataDir, "load-base.db");
const dbFile = path.join(dataDir, "load.db");
const LOT = "P26-0001";
const writeBody = JSON.stringify({ step: "measuring", inputs: [{ lot: LOT, quantity: 0 }], measurements: [{ name: "moisturePct", value: 13.4, unit: "%" }] });

function removeDatabase(file: string) {
  for (const s of ["", "-wal", "-shm"]) rmSync(file + s, { force: true });
}

/** The demo database, migrated and seeded once; every measurement starts from a copy of it. */
function prepareDatabase() {
  mkdirSync(dataDir, { recursive: true });
  removeDatabase(baseFile);
  execFileSync(process.execPath, [path.join(root, "node_modules/tsx/dist/cli.mjs"), "--conditions=react-server", "src/cli/prepare-db.ts"], { cwd: root, env: { ...process.env, GRAINLINE_DB: baseFile } });
}

function freshCopy() {
  removeDatabase(dbFile);
  copyFileSync(baseFile, dbFile);
}

/**
 * Runs both route handlers in this process on a connection that logs every statement with
 * its values (better-sqlite3's verbose hook), and returns a session cookie and the SQL of
 * one request of each route — what the bare server then runs.
 */
async function captureStatements() {
  const log: string[] = [];
  // On the base itself: the rows the captured write refers to (its event) are then in every copy.
  const sqlite = new Database(baseFile, { verbose: (s) => log.push(String(s)) });
  for (const p of ["journal_mode = WAL", "busy_timeout = 5000", "foreign_keys = ON", "synchronous = NORMAL"]) sqlite.pragma(p);
  (globalThis as { grainlineDb?: unknown }).grainlineDb = { sqlite }; // the app's modules use this connection
  const { lucia } = await import("../src/server/accounts/auth");
  const { openSession } = await import("../src/server/accounts/session-token");
  const { token, session } = await openSession("user-brewer");
  const cookie = `${lucia().sessionCookieName}=${token}`;
  const lotRoute = await import("../app/api/lots/[code]/route");
  const eventsRoute = await import("../app/api/events/route");
  const read = () => lotRoute.GET(new Request(`http://localhost/api/lots/${LOT}`, { headers: { cookie } }), { params: Promise.resolve({ code: LOT }) });
  const write = () => eventsRoute.POST(new Request("http://localhost/api/events", { method: "POST", headers: { cookie, "content-type": "application/json" }, body: writeBody }));
  const once = async (call: () => Promise<Response>, status: number) => {
    await call();
    log.length = 0;
    const response = await call();
    if (response.status !== status) throw new Error(`capture: ${response.status} ${await response.text()}`);
    // Transaction control is the bare server's own (it runs the write in one IMMEDIATE transaction).
    // SQLite shortens long string values in the logged text; the session id is put back whole.
    return log
      .splice(0)
      .filter((s) => !/^(begin|commit|rollback|savepoint|release)\b/i.test(s.trim()))
      .map((s) => s.replace(/'([^']*)'\/\*\+\d+ bytes\*\//g, (whole, start: string) => (session.id.startsWith(start) ? `'${session.id}'` : whole)));
  };
  const statements = { read: await once(read, 200), write: await once(write, 201) };
  const shortened = [...statements.read, ...statements.write].find((s) => s.includes("bytes*/"));
  if (shortened) throw new Error(`capture: a value was shortened in ${shortened}`);
  sqlite.close(); // checkpoints the WAL into the file the copies are made from
  return { cookie, statements };
}

type Result = { rps: number; p99: number; non2xx: number };

function hasWrk(): boolean {
  try {
    execFileSync("wrk", ["--version"], { stdio: "ignore" });
    return true;
  } catch (error) {
    // wrk prints its version and exits 1; only a missing binary is ENOENT.
    return (error as NodeJS.ErrnoException).code !== "ENOENT";
  }
}
const useWrk = hasWrk();

function toMs(value: string): number {
  const m = /^([\d.]+)(us|ms|s)$/.exec(value);
  if (!m) throw new Error(`wrk latency ${value}`);
  return Number(m[1]) * (m[2] === "us" ? 0.001 : m[2] === "s" ? 1000 : 1);
}

async function load(url: string, duration: number, headers: Record<string, string>, method = "GET", body?: string): Promise<Result> {
  if (!useWrk) {
    const r = await autocannon({ url, connections: 50, duration, method: method as "GET", headers, body });
    return { rps: r.requests.average, p99: r.latency.p99, non2xx: r.non2xx };
  }
  const script = path.join(dataDir, "wrk.lua");
  const lines = [`wrk.method = ${JSON.stringify(method)}`, ...Object.entries(headers).map(([k, v]) => `wrk.headers[${JSON.stringify(k)}] = ${JSON.stringify(v)}`)];
  if (body) lines.push(`wrk.body = ${JSON.stringify(body)}`);
  writeFileSync(script, lines.join("\n"));
  const out = execFileSync("wrk", ["-t1", "-c50", `-d${duration}s`, "--latency", "-s", script, url], { encoding: "utf8" });
  const rps = Number(/Requests\/sec:\s+([\d.]+)/.exec(out)![1]);
  const p99 = toMs(/^\s+99%\s+(\S+)/m.exec(out)![1]!);
  const non2xx = Number(/Non-2xx or 3xx responses:\s+(\d+)/.exec(out)?.[1] ?? 0);
  return { rps, p99, non2xx };
}

/** One route on one server, from a fresh copy of the base database: warm-up, then the measured run. */
async function measure(args: string[], env: Record<string, string>, ready: string, cookie: string, key: "read" | "write"): Promise<Result> {
  freshCopy();
  // Let the disk finish writing out the last run's pages before this one starts.
  execFileSync("sync");
  await new Promise((r) => setTimeout(r, 1000));
  const headers = { cookie, "content-type": "application/json" };
  const url = `${base}${key === "read" ? `/api/lots/${LOT}` : "/api/events"}`;
  const method = key === "read" ? "GET" : "POST";
  const body = key === "read" ? undefined : writeBody;
  return withServer(args, env, ready, async () => {
    // Warm-up: JIT, statement caches, and Next loading its route modules in the background after start.
    await load(url, 5, headers, method, body);
    return load(url, seconds, headers, method, body);
  });
}


async function withServer<T>(args: string[], env: Record<string, string>, ready: string, fn: () => Promise<T>): Promise<T> {
  const child = spawn(process.execPath, args, { cwd: root, env: { ...process.env, NEXT_TELEMETRY_DISABLED: "1", ...env }, stdio: "ignore" });
  try {
    await waitFor(ready, 600);
    return await fn();
  } finally {
    await stop(child);
  }
}

buildIfNeeded();
prepareDatabase();
const base = `http://localhost:${PORT}`;
const { cookie, statements } = await captureStatements();
const statementsFile = path.join(dataDir, "statements.json");
writeFileSync(statementsFile, JSON.stringify(statements, null, 2));
const appEnv = { GRAINLINE_DB: dbFile, PORT: String(PORT) };

const servers = {
  bare: [["--conditions=react-server", "--import", "tsx", "bench/bare-server.ts", dbFile, statementsFile, String(PORT)], {}, `${base}/api/lots/${LOT}`],
  app: [SERVE_ARGS, appEnv, `${base}/sign-in`],
} as const;
type Name = keyof typeof servers;
type Key = "read" | "write";
const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
};

async function closedBench() {
  const runs: Record<Name, Record<Key, Result[]>> = { bare: { read: [], write: [] }, app: { read: [], write: [] } };
  // All reads first, then all writes: no read runs just after a write-heavy run. Bare and app
  // take turns, round after round, so a machine that speeds up or slows down meets both alike.
  for (const key of ["read", "write"] as const) {
    for (let round = 0; round < rounds; round++) {
      for (const name of Object.keys(servers) as Name[]) {
        const [args, env, ready] = servers[name];
        runs[name][key].push(await measure([...args], { ...env }, ready, cookie, key));
      }
    }
  }

  /** A server's median run: the median throughput and the median p99 of its runs. */
  const summary = (r: Result[]): Result => ({ rps: median(r.map((x) => x.rps)), p99: median(r.map((x) => x.p99)), non2xx: r.reduce((n, x) => n + x.non2xx, 0) });
  const ratios = (key: Key) => runs.app[key].map((r, i) => r.rps / runs.bare[key][i]!.rps);
  const spread = (values: number[]) => (values.length > 1 ? `  (runs ${Math.min(...values).toFixed(2)}–${Math.max(...values).toFixed(2)})` : "");

  const cell = (r: Result) => `${r.rps.toFixed(0).padStart(6)} req/s  p99 ${r.p99.toFixed(1).padStart(6)} ms${r.non2xx ? `  (non-2xx ${r.non2xx})` : ""}`;
  const p99s = (r: Result[]) => (r.length > 1 ? `  each run ${r.map((x) => `${x.rps.toFixed(0)}/s ${x.p99.toFixed(0)} ms`).join(", ")}` : "");
  const row = (name: string, key: Key) => {
    const [bare, app] = (["bare", "app"] as const).map((n) => summary(runs[n][key])) as [Result, Result];
    return [
      `${name} (${statements[key].length} SQL statements a request)`,
      `  bare                     ${cell(bare)}${p99s(runs.bare[key])}`,
      `  app, production server   ${cell(app)}   app/bare ${median(ratios(key)).toFixed(2)}${spread(ratios(key))}${p99s(runs.app[key])}`,
    ].join("\n");
  };
  console.log(`50 connections, ${seconds} s a run, median of ${rounds} run${rounds > 1 ? "s" : ""}, load from ${useWrk ? "wrk (1 thread)" : "autocannon"}, ${process.platform} ${process.arch}, Node ${process.version}`);
  console.log(row("GET /api/lots/{code}", "read"));
  console.log(row("POST /api/events", "write"));
  const met = (key: Key) => median(ratios(key)) >= 0.5 && summary(runs.app[key]).p99 <= 50;
  console.log(`Goal (app ≥ 0.50 × bare, p99 ≤ 50 ms, medians): lot read ${met("read") ? "met" : "NOT met"}, floor write ${met("write") ? "met" : "NOT met"}.`);
}

const OPEN_CONNECTIONS = 100;
const OPEN_WARM_UP = 10;
/** 70 % lot reads, 30 % floor writes: a phone looks a bag up more often than it records a step on it. */
const floorMix = (cookie: string) => ({
  writeShare: 0.3,
  read: { path: `/api/lots/${LOT}`, status: 200 },
  write: { path: "/api/events", body: writeBody, status: 201 },
  headers: { cookie },
});
/** One rate on the production server, from a fresh copy of the base database: a warm-up that opens every connection, then the runs. */
async function measureOpen(rate: number): Promise<OpenRun[]> {
  freshCopy();
  execFileSync("sync");
  await new Promise((r) => setTimeout(r, 1000));
  const [args, env, ready] = servers.app;
  return withServer([...args], { ...env }, ready, async () => {
    const floor = openFloor(base, OPEN_CONNECTIONS, floorMix(cookie));
    try {
      await floor.run(rate, OPEN_WARM_UP);
      const runs: OpenRun[] = [];
      for (let i = 0; i < openRuns; i++) runs.push(await floor.run(rate, openSeconds, { seed: i + 2 }));
      return runs;
    } finally {
      floor.close();
    }
  });
}

async function openBench() {
  const results: { rate: number; runs: OpenRun[] }[] = [];
  for (const rate of openRates) results.push({ rate, runs: await measureOpen(rate) });

  const ms = (v: number) => (v >= 100 ? v.toFixed(0) : v.toFixed(1));
  const each = (runs: OpenRun[], key: "p50" | "p99") => `${ms(median(runs.map((r) => r[key])))} ms (${runs.map((r) => ms(r[key])).join(", ")})`;
  console.log(
    `Open model: ${OPEN_CONNECTIONS} connections, a fixed arrival rate, ${floorMix("").writeShare * 100} % floor writes (POST /api/events) and the rest lot reads (GET /api/lots/{code}); ` +
      `latency from each request's scheduled send; ${openRuns} × ${openSeconds} s after a ${OPEN_WARM_UP} s warm-up; median (runs)`,
  );
  for (const { rate, runs } of results) {
    const failed = runs.reduce((n, r) => n + r.failed, 0);
    const writes = runs.reduce((n, r) => n + r.writes, 0) / runs.reduce((n, r) => n + r.sent, 0);
    const lag = Math.max(...runs.map((r) => r.sendLag));
    console.log(
      `  ${String(rate).padStart(4)}/s  p50 ${each(runs, "p50")}  p99 ${each(runs, "p99")}  max ${ms(Math.max(...runs.map((r) => r.max)))} ms` +
        `  writes ${(writes * 100).toFixed(0)} %  driver lag ≤ ${ms(lag)} ms${failed ? `  FAILED ${failed}` : ""}`,
    );
  }
  // The goal the one request path is held to: p99 ≤ 50 ms at the floor's 200 req/s (bench/LOAD.md).
  for (const { rate, runs } of results) {
    const p99 = median(runs.map((r) => r.p99));
    const worst = Math.max(...runs.map((r) => r.p99));
    console.log(`  at ${rate}/s: p99 ${ms(p99)} ms (median), ${ms(worst)} ms (worst run): ${p99 <= 50 ? (worst <= 50 ? "holds 50 ms in every run" : "holds 50 ms in the median, not in every run") : "does NOT hold 50 ms"}.`);
  }
}

if (only !== "open") await closedBench();
if (only !== "closed") await openBench();
