/**
 * `npm run bench:provenance`: the provenance answer behind the bottle page, in-process (no
 * server, no rendering), on a copy of the 10-season ledger (bench/.data/provenance.db):
 *   - the first view of 120 bottlings around the median one, each lineage read anew, three ways:
 *     with nothing kept (every tank's facts and every date worked out, as for the first bottling
 *     viewed after a restart); in order after a restart (each bottling finds what the ones before
 *     it left: a house blend's bottlings share their tanks); and with the figures of every tank
 *     and date kept. The time of the read, of judging the categories over every tank behind it,
 *     and of the whole answer, with the size of each lineage;
 *   - the pages bench's bottling viewed again, and viewed after an edge of weight 0 into it (its
 *     kept lineage brought up to date).
 * The lineage reading, the claims and the card's other reads are the parts of the pages bench's
 * server time that depend on the ledger; the rest is Next's rendering. Figures: bench/PAGES.md.
 */
import { copyFileSync, rmSync } from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { ensureLedger } from "./generate-ledger";

const root = path.resolve(import.meta.dirname, "..");
const dbFile = path.join(root, "bench/.data/provenance.db");
const { file: ledger } = await ensureLedger(10);
for (const s of ["", "-wal", "-shm"]) rmSync(dbFile + s, { force: true });
copyFileSync(ledger, dbFile);
process.env.GRAINLINE_DB = dbFile;
// The work itself is timed: the server's warm-up after a start (src/server/trace/warm-up.ts) is timed apart, last.
process.env.GRAINLINE_WARM = "0";
const { ancestryOf, ancestryReadAnew } = await import("../src/server/trace/ancestry");
const { claimedCategories } = await import("../src/server/trace/claims");
const { findBottling, provenanceOf, publicProvenance } = await import("../src/server/trace/provenance");
const { forgetKept, keptCounts } = await import("../src/server/trace/kept-by-lot");
const { warmInBackground } = await import("../src/server/trace/warm-up");

const sqlite = new Database(dbFile);
type Bottling = { id: number; code: string; gtin: string };
const bottlings = (sqlite
  .prepare(`select id, code, json_extract(attributes, '$.gtin') as gtin from lots where kind = 'bottled' and gtin is not null
    order by id limit 121 offset (select count(*) / 2 from lots where kind = 'bottled' and json_extract(attributes, '$.gtin') is not null) - 60`)
  .all() as { id: number; code: string; gtin: number }[]).map((b) => ({ ...b, gtin: String(b.gtin).padStart(14, "0") }));
const median = bottlings[60]!;
const others = bottlings.filter((b) => b !== median);
const quantile = (xs: number[], q: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.ceil(q * xs.length) - 1)]!;
const line = (name: string, xs: number[]) => console.log(`| ${name} | ${quantile(xs, 0.5).toFixed(1)} | ${quantile(xs, 0.95).toFixed(1)} | ${Math.max(...xs).toFixed(1)} |`);

// The edge index is loaded by the first read: timed apart, then every bottling once to warm the code.
let started = performance.now();
ancestryOf(median.id);
const loadMs = performance.now() - started;
for (const b of others) publicProvenance(b.gtin, b.code);

type Views = { read: number[]; claims: number[]; whole: number[]; lots: number[]; tanks: number[] };
/** Each bottling viewed once, its lineage read anew; `before` runs ahead of each, outside the time. */
function firstViews(before: () => void = () => {}): Views {
  const views: Views = { read: [], claims: [], whole: [], lots: [], tanks: [] };
  for (const b of others) {
    before();
    started = performance.now();
    const head = findBottling(b.gtin, b.code);
    const ancestry = ancestryReadAnew(b.id);
    const read = performance.now() - started;
    const claims = claimedCategories(b.id, ancestry);
    const judged = performance.now() - started;
    provenanceOf(head, claims, ancestry);
    views.whole.push(performance.now() - started);
    views.read.push(read), views.claims.push(judged - read);
    views.lots.push(ancestry.ids.length), views.tanks.push(ancestry.kinds.filter((k) => k === "tank").length);
  }
  return views;
}
const nothingKept = firstViews(forgetKept);
forgetKept();
const inOrder = firstViews();
const allKept = firstViews();
const writer = new Database(dbFile);
const linkInto = (id: number) => {
  const event = writer.prepare("insert into events (step, at, recorded_at, user_id, party_id) select 'blending', 0, 0, user_id, party_id from events order by id desc limit 1").run().lastInsertRowid;
  writer.prepare("insert into lineage_edges (event_id, parent_lot_id, child_lot_id, weight) select ?, parent_lot_id, child_lot_id, 0 from lineage_edges where child_lot_id = ? limit 1").run(event, id);
};
const again: number[] = [];
const afterEdge: number[] = [];
for (let i = 0; i < 120; i++) {
  started = performance.now();
  publicProvenance(median.gtin, median.code);
  if (i >= 20) again.push(performance.now() - started);
  linkInto(median.id);
  started = performance.now();
  publicProvenance(median.gtin, median.code);
  if (i >= 20) afterEdge.push(performance.now() - started);
}
// The warm-up a server sets going with its first provenance answer, from nothing kept: how long
// until every tank's facts and every dated lot's dates are kept (in slices, between nothing here).
forgetKept();
process.env.GRAINLINE_WARM = "1";
started = performance.now();
await warmInBackground();
const warmMs = performance.now() - started;
const warmed = keptCounts();
writer.close();
sqlite.close();
for (const s of ["", "-wal", "-shm"]) rmSync(dbFile + s, { force: true });

console.log(`provenance bench, ${new Date().toISOString()}: edge index loaded in ${loadMs.toFixed(0)} ms (with the first lineage)`);
console.log(`first views: ${others.length} bottlings around ${median.code}; lots behind each p50 ${quantile(allKept.lots, 0.5)}, p95 ${quantile(allKept.lots, 0.95)}, max ${Math.max(...allKept.lots)}; tanks p50 ${quantile(allKept.tanks, 0.5)}, max ${Math.max(...allKept.tanks)}`);
console.log("| in-process, ms | p50 | p95 | max |");
console.log("| --- | ---: | ---: | ---: |");
for (const [name, views] of [["nothing kept", nothingKept], ["in order after a restart", inOrder], ["every tank's facts and dates kept", allKept]] as const) {
  line(`first view, ${name}: lineage read anew`, views.read);
  line(`first view, ${name}: categories judged over every tank`, views.claims);
  line(`first view, ${name}: the whole answer`, views.whole);
}
line(`${median.code} viewed again`, again);
line(`${median.code} after an edge into it (brought up to date)`, afterEdge);
console.log(`warm-up after a start: ${warmMs.toFixed(0)} ms to keep the facts of ${warmed["tank facts"]} tanks and the dates of ${warmed["key dates"]} lots`);
