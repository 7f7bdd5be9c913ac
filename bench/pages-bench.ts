/**
 * `npm run bench:pages`: the pages people open most, on the 10-season ledger, through the
 * production server (src/cli/serve.ts) on a copy of bench/.data/ledger-10s-v2.db:
 *   - server time: time to the full HTML answer, ~100 sequential requests per page after a
 *     warm-up, signed in as the office admin over HTTP (POST /api/auth/sign-in);
 *   - transferred JS: the `<script src>` files the page's HTML loads, each gzipped here with
 *     zlib at level 6 and summed. The `noModule` polyfill script is counted apart: browsers
 *     that run modules (every phone the floor uses) never download it.
 * Needs a production build. Options: --runs=N (default 100), --warmup=N (default 20).
 * Figures and how to read them: bench/PAGES.md.
 */
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { copyFileSync, mkdirSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { gzipSync } from "node:zlib";
import { hash } from "@node-rs/argon2";
import Database from "better-sqlite3";
import { buildIfNeeded, SERVE_ARGS } from "../src/cli/serve-command";
import { ensureLedger } from "./generate-ledger";
import { stop, waitFor } from "./server-process";

const root = path.resolve(import.meta.dirname, "..");
const dbFile = path.join(root, "bench/.data/pages.db");
const PORT = 3402;
const base = `http://localhost:${PORT}`;
const option = (name: string, fallback: number) => Number(process.argv.find((a) => a.startsWith(`--${name}=`))?.split("=")[1] ?? fallback);
const runs = option("runs", 100);
const warmup = option("warmup", 20);
const EMAIL = "office@bench.example";
const PASSWORD = "pages-bench-password";
const PHONE_UA = "Mozilla/5.0 (Linux; Android 14; Pixel 8) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/131.0 Mobile Safari/537.36";
const DESK_UA = "Mozilla/5.0 (X11; Linux x86_64) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/131.0 Safari/537.36";

function removeDatabase(file: string) {
  for (const s of ["", "-wal", "-shm"]) rmSync(file + s, { force: true });
}

/** A copy of the ledger, migrated, with a password for the bench's admin; and the lots the pages show. */
async function prepareCopy(ledger: string) {
  removeDatabase(dbFile);
  copyFileSync(ledger, dbFile);
  execFileSync(process.execPath, [path.join(root, "node_modules/tsx/dist/cli.mjs"), "--conditions=react-server", "src/cli/prepare-db.ts"], {
    cwd: root,
    env: { ...process.env, GRAINLINE_DB: dbFile, GRAINLINE_SEED: "none" },
  });
  const sqlite = new Database(dbFile);
  // The same argon2id parameters as src/server/accounts/passwords.ts (OWASP's first set).
  const passwordHash = await hash(PASSWORD, { algorithm: 2, memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 });
  sqlite.prepare("update users set password_hash = ?, locale = 'en' where email = ?").run(passwordHash, EMAIL);
  const one = (sql: string) => (sqlite.prepare(sql).get() as { v: string } | undefined)?.v;
  // Deterministic picks from the middle of the ledger: the lot with the median id of its kind.
  const median = (kind: string, extra = "") =>
    one(`select code as v from lots where kind = '${kind}' ${extra} order by id limit 1 offset (select count(*) / 2 from lots where kind = '${kind}' ${extra})`);
  const polished = median("polished");
  const harvest = median("harvest");
  const bottled = median("bottled", "and json_extract(attributes, '$.gtin') is not null");
  const gtin = one(`select json_extract(attributes, '$.gtin') as v from lots where code = '${bottled}'`);
  const grower = one("select id as v from parties where kind = 'grower' order by id limit 1");
  const mill = one("select id as v from parties where kind = 'mill' order by id limit 1");
  // Bottlings around the median one, one for each request of the "not viewed lately" row.
  const others = (sqlite
    .prepare(`select code, json_extract(attributes, '$.gtin') as gtin from lots where kind = 'bottled' and gtin is not null and code <> ?
      order by id limit ? offset max(0, (select count(*) / 2 from lots where kind = 'bottled' and json_extract(attributes, '$.gtin') is not null) - ? / 2)`)
    .all(bottled, warmup + runs, warmup + runs) as { code: string; gtin: number }[]).map((b) => `/01/${String(b.gtin).padStart(14, "0")}/10/${b.code}`);
  sqlite.close();
  if (!polished || !harvest || !bottled || !gtin || !grower || !mill) throw new Error("the ledger lacks a lot, grower or mill the pages need");
  return { polished, harvest, bottled, gtin: String(gtin).padStart(14, "0"), grower, mill, others };
}

async function signIn(): Promise<string> {
  const response = await fetch(`${base}/api/auth/sign-in`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: base },
    body: JSON.stringify({ email: EMAIL, password: PASSWORD }),
  });
  if (response.status !== 200) throw new Error(`sign-in: ${response.status} ${await response.text()}`);
  return response.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
}

/** `before` runs ahead of each request, outside the time measured; `paths`, when given, names a page for each request in turn. */
type Page = { name: string; path: string; paths?: string[]; ua: string; signedIn: boolean; before?: () => void };

async function getPage(page: Page, cookie: string, request: number): Promise<{ ms: number; html: string }> {
  const address = page.paths?.[request % page.paths.length] ?? page.path;
  const started = performance.now();
  const response = await fetch(base + address, {
    redirect: "manual",
    headers: { "user-agent": page.ua, "accept-language": "en", accept: "text/html", ...(page.signedIn ? { cookie } : {}) },
  });
  const html = await response.text();
  const ms = performance.now() - started;
  if (response.status !== 200) throw new Error(`${address}: ${response.status}`);
  return { ms, html };
}

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;

/** The scripts the HTML names, each fetched and gzipped at level 6 (what a server sending gzip would send). */
async function scriptBytes(html: string) {
  const tags = [...html.matchAll(/<script\b[^>]*\bsrc="([^"]+)"[^>]*>/g)];
  let modern = 0;
  let noModule = 0;
  const files: { src: string; gzip: number; noModule: boolean }[] = [];
  for (const [tag, src] of tags) {
    if (files.some((f) => f.src === src)) continue;
    const body = Buffer.from(await (await fetch(new URL(src!.replace(/&amp;/g, "&"), base))).arrayBuffer());
    const gzip = gzipSync(body, { level: 6 }).length;
    const isNoModule = /\bnoModule\b/i.test(tag);
    files.push({ src: src!, gzip, noModule: isNoModule });
    if (isNoModule) noModule += gzip;
    else modern += gzip;
  }
  return { modern, noModule, files };
}

const load = () => os.loadavg().map((n) => n.toFixed(2)).join(" ");

buildIfNeeded();
const { file: ledger } = await ensureLedger(10);
const picks = await prepareCopy(ledger);
const pages: Page[] = [
  { name: "scan card (phone)", path: `/scan?code=${picks.polished}`, ua: PHONE_UA, signedIn: true },
  { name: "lot page", path: `/lots/${picks.polished}`, ua: DESK_UA, signedIn: true },
  { name: "provenance card", path: `/01/${picks.gtin}/10/${picks.bottled}`, ua: PHONE_UA, signedIn: false },
  { name: "recall of a harvest lot", path: `/recall?code=${picks.harvest}`, ua: DESK_UA, signedIn: true },
  { name: "supplier account", path: `/suppliers/${picks.grower}`, ua: DESK_UA, signedIn: true },
  // A mill's account lists its polishing runs (1,535 at bench-mill, all without a contract fee).
  { name: "supplier account (mill)", path: `/suppliers/${picks.mill}`, ua: DESK_UA, signedIn: true },
  { name: "sign-in (reference)", path: "/sign-in", ua: PHONE_UA, signedIn: false },
  // Each request a bottling no one viewed lately (the server keeps 16 lineages): the lineage is
  // read from the database every time, as for the first scan of a batch.
  { name: "provenance card, a bottling not viewed lately", path: picks.others[0]!, paths: picks.others, ua: PHONE_UA, signedIn: false },
  // Last, so that no page above sees the events these record before each request (none changes
  // an answer). After an event elsewhere: one with no lots, as the floor records all day on other
  // lots. After a draw from the bottle: an event that draws 0 bottles from it (a shipment or a
  // sample), which touches its lineage without changing it. In both the server keeps the lineage.
  // Brought up to date: an edge of weight 0 into the bottle from one of its parents, so that the
  // lineage has changed; the server merges the new edge into the lineage it kept.
  { name: "provenance card, after an event elsewhere", path: `/01/${picks.gtin}/10/${picks.bottled}`, ua: PHONE_UA, signedIn: false, before: () => recordEvent(null) },
  { name: "provenance card, after a draw from the bottle", path: `/01/${picks.gtin}/10/${picks.bottled}`, ua: PHONE_UA, signedIn: false, before: () => recordEvent({ drawFrom: picks.bottled }) },
  { name: "provenance card, after an edge into the bottle", path: `/01/${picks.gtin}/10/${picks.bottled}`, ua: PHONE_UA, signedIn: false, before: () => recordEvent({ linkInto: picks.bottled }) },
];

let writer: Database.Database | undefined;
function recordEvent(lots: { drawFrom?: string; linkInto?: string } | null) {
  writer ??= new Database(dbFile);
  const event = writer.prepare("insert into events (step, at, recorded_at, user_id, party_id) select 'blending', 0, 0, user_id, party_id from events order by id desc limit 1").run().lastInsertRowid;
  if (lots?.drawFrom) writer.prepare("insert into event_inputs (event_id, lot_id, quantity, content, use) select ?, id, 0, 0, 'draw' from lots where code = ?").run(event, lots.drawFrom);
  if (lots?.linkInto) {
    writer
      .prepare("insert into lineage_edges (event_id, parent_lot_id, child_lot_id, weight) select ?, e.parent_lot_id, e.child_lot_id, 0 from lineage_edges e join lots l on l.id = e.child_lot_id where l.code = ? limit 1")
      .run(event, lots.linkInto);
  }
}

const loadBefore = load();
const child = spawn(process.execPath, SERVE_ARGS, { cwd: root, env: { ...process.env, NEXT_TELEMETRY_DISABLED: "1", GRAINLINE_DB: dbFile, PORT: String(PORT) }, stdio: "ignore" });
const results: { name: string; path: string; p50: number; p95: number; max: number; htmlKB: number; jsKB: number; noModuleKB: number }[] = [];
try {
  await waitFor(`${base}/sign-in`);
  const cookie = await signIn();
  for (const page of pages) {
    for (let i = 0; i < warmup; i++) page.before?.(), await getPage(page, cookie, i);
    const times: number[] = [];
    let html = "";
    for (let i = 0; i < runs; i++) page.before?.(), ({ ms: times[i], html } = await getPage(page, cookie, warmup + i));
    times.sort((a, b) => a - b);
    const js = await scriptBytes(html);
    results.push({
      name: page.name, path: page.path,
      p50: percentile(times, 50), p95: percentile(times, 95), max: times.at(-1)!,
      htmlKB: Buffer.byteLength(html) / 1000, jsKB: js.modern / 1000, noModuleKB: js.noModule / 1000,
    });
  }
} finally {
  await stop(child);
  writer?.close();
  removeDatabase(dbFile);
}
const loadAfter = load();

console.log(`pages bench, ${new Date().toISOString()}, ${runs} sequential requests per page after ${warmup} warm-up; load average before ${loadBefore}, after ${loadAfter}`);
console.log(`lots: polished ${picks.polished}, harvest ${picks.harvest}, bottled ${picks.bottled} (GTIN ${picks.gtin}), grower ${picks.grower}, mill ${picks.mill}`);
console.log("| page | path | server p50 ms | p95 ms | max ms | HTML kB | JS kB gzip | + noModule polyfill kB |");
console.log("| --- | --- | ---: | ---: | ---: | ---: | ---: | ---: |");
for (const r of results) {
  console.log(`| ${r.name} | \`${r.path}\` | ${r.p50.toFixed(1)} | ${r.p95.toFixed(1)} | ${r.max.toFixed(1)} | ${r.htmlKB.toFixed(0)} | ${r.jsKB.toFixed(1)} | ${r.noModuleKB.toFixed(1)} |`);
}
writeFileSync(path.join(root, "bench/.data/pages.json"), JSON.stringify({ at: new Date().toISOString(), loadBefore, loadAfter, picks, results }, null, 2));
