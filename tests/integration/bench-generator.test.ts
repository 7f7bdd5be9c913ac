import { mkdirSync, rmSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getSqlite } from "@/server/platform/db";
import { ancestryOf } from "@/server/trace/ancestry";
import { provenanceOf } from "@/server/trace/provenance";
import { generateLedger, TINY, type LedgerCounts } from "../../bench/generate-ledger";

// The benchmark's synthetic ledger, generated small. The invariants are those of the mixing
// rule of ../shared/product.md ("The model"): shares of a lot over its harvest lots add up to 1,
// and the composition kept as events were recorded equals the walk over the lineage edges.
const dir = path.resolve("tests/.tmp");
const files: string[] = [];
const fileFor = (name: string) => {
  const file = path.join(dir, `bench-${name}-${process.pid}-${Date.now()}.db`);
  files.push(file);
  return file;
};

/** The app keeps one connection per process; each generation gets its own file. */
function releaseConnection() {
  const held = globalThis as { grainlineDb?: { sqlite: { close(): void } } };
  held.grainlineDb?.sqlite.close();
  delete held.grainlineDb;
}

type Digest = {
  counts: LedgerCounts;
  lots: string;
  stepCounts: Record<string, number>;
  edgesByStep: Record<string, number>;
  sums: { code: string; kind: string; total: number; contentIn: number }[];
  walked: number;
  walkDifference: number;
  multiSeasonBlends: number;
  datedBottlings: number;
  datesDiffering: string[];
};

/**
 * A bottling's key dates as the provenance card read them before it looked up only the lots that
 * can come out of a dated step: every lot behind it through bottlings, blends, sake and tanks,
 * whatever its kind, by SQLite's own recursive read.
 */
const DATES = `with recursive up(lot_id) as (
    select ?
    union
    select e.parent_lot_id from up join lineage_edges e on e.child_lot_id = up.lot_id
    join lots c on c.id = up.lot_id where c.kind in ('bottled', 'blend', 'sake', 'tank'))
  select ev.step, min(ev.at) as at from up join event_outputs o on o.lot_id = up.lot_id join events ev on ev.id = o.event_id
  where ev.step in ('mash-addition', 'pressing', 'bottling') and not exists (select 1 from events c where c.corrects = ev.id)
  group by ev.step, up.lot_id`;

/** The bare recursive walk over lineage edges (as in trace.test.ts): independent of the composition rows. */
const WALK = `with recursive up(lot_id, frac) as (
    select ?, 1.0
    union all
    select e.parent_lot_id, up.frac * e.weight / c.content_in
    from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = up.lot_id
    where c.content_in > 0)
  select up.lot_id as id, sum(frac) as share from up join lots l on l.id = up.lot_id
  where l.kind = 'harvest' group by up.lot_id having abs(sum(frac)) > 1e-9`;

async function generate(name: string, seasons: number, seed: number): Promise<Digest> {
  releaseConnection();
  const counts = await generateLedger(fileFor(name), { seasons, shape: TINY, seed });
  const db = getSqlite();
  const byKey = (rows: unknown[]) => Object.fromEntries((rows as { k: string; n: number }[]).map((r) => [r.k, r.n]));
  const kept = db.prepare("select source_lot_id as id, sum(amount) as amount from lot_source_deltas where lot_id = ? group by source_lot_id having abs(sum(amount)) > 1e-9");
  const walk = db.prepare(WALK);
  let walkDifference = 0;
  const finished = db.prepare("select id, content_in as contentIn from lots where kind in ('blend', 'bottled') and content_in > 0").all() as { id: number; contentIn: number }[];
  for (const lot of finished) {
    const index = new Map((kept.all(lot.id) as { id: number; amount: number }[]).map((r) => [r.id, r.amount / lot.contentIn]));
    const walked = new Map((walk.all(lot.id) as { id: number; share: number }[]).map((r) => [r.id, r.share]));
    for (const id of new Set([...index.keys(), ...walked.keys()])) walkDifference = Math.max(walkDifference, Math.abs((index.get(id) ?? 0) - (walked.get(id) ?? 0)));
  }
  const dates = db.prepare(DATES);
  const bottlings = db.prepare("select id, code, kind, content_in as contentIn from lots where kind = 'bottled'").all() as { id: number; code: string; kind: string; contentIn: number }[];
  const datesDiffering = bottlings.filter((b) => {
    const card = provenanceOf(b, null, ancestryOf(b.id));
    const rows = dates.all(b.id) as { step: string; at: number }[];
    const of = (step: string) => rows.filter((r) => r.step === step).map((r) => new Date(r.at).toISOString()).sort();
    return JSON.stringify([card.brewedOn, card.pressedOn, card.bottledOn].map((d) => [...d].sort())) !== JSON.stringify([of("mash-addition"), of("pressing"), of("bottling")]);
  });
  return {
    datedBottlings: bottlings.length,
    datesDiffering: datesDiffering.map((b) => b.code),
    counts,
    lots: (db.prepare("select group_concat(code || ':' || kind || ':' || round(quantity_in, 3), ',') as s from (select * from lots order by id)").get() as { s: string }).s,
    stepCounts: byKey(db.prepare("select step as k, count(*) as n from events group by step").all()),
    edgesByStep: byKey(db.prepare("select e.step as k, count(*) as n from lineage_edges l join events e on e.id = l.event_id group by e.step").all()),
    sums: db.prepare("select l.code, l.kind, l.content_in as contentIn, sum(d.amount) as total from lots l join lot_source_deltas d on d.lot_id = l.id group by l.id").all() as Digest["sums"],
    walked: finished.length,
    walkDifference,
    // Blends whose rice comes from more than one crop year: aged stock blended into a later season.
    multiSeasonBlends: (db.prepare(`select count(*) as n from (select d.lot_id from lot_source_deltas d join lots l on l.id = d.lot_id join lots s on s.id = d.source_lot_id
      where l.kind = 'blend' group by d.lot_id having count(distinct s.crop_year) > 1)`).get() as { n: number }).n,
  };
}

let one: Digest, again: Digest, two: Digest;

beforeAll(async () => {
  mkdirSync(dir, { recursive: true });
  one = await generate("one", 1, 11);
  again = await generate("again", 1, 11);
  two = await generate("two", 2, 11);
}, 60_000);

afterAll(() => {
  releaseConnection();
  for (const file of files) for (const suffix of ["", "-wal", "-shm"]) rmSync(file + suffix, { force: true });
});

describe("the benchmark ledger generator (TINY shape)", () => {
  it("gives every lot composition shares that add up to 1, harvest lots included", () => {
    expect(one.sums.length).toBe(one.counts.lots);
    for (const row of one.sums) {
      // A polishing run taken back by a correction leaves its lots with no content and no composition.
      if (row.contentIn === 0) expect(Math.abs(row.total), row.code).toBeLessThan(1e-9);
      else expect(Math.abs(row.total / row.contentIn - 1), `${row.code} (${row.kind})`).toBeLessThan(1e-9);
    }
    expect(one.stepCounts.correcting).toBe(TINY.correctionsPerSeason);
  });

  it("writes the documented shape: per tank 21 lots besides its soak batches, 2 edges per soak batch and 25 more", () => {
    const k = one.counts.lotsByKind;
    const tanks = k.tank!;
    expect(tanks).toBeGreaterThanOrEqual(4);
    expect([k.koji, k.starter, k.lees, k.sake, k.steamed]).toEqual([4 * tanks, tanks, tanks, 3 * tanks, 11 * tanks]);
    const brewSteps = ["soaking", "steaming", "splitting", "koji-making", "starter", "mash-addition", "pressing"];
    expect(brewSteps.reduce((a, step) => a + (one.edgesByStep[step] ?? 0), 0)).toBe(2 * k.soaked! + 25 * tanks);
    expect([k.polished, k.bran, k.bottled]).toEqual([one.stepCounts.polishing, one.stepCounts.polishing, one.stepCounts.bottling]);
  });

  it("includes blends of blends, and blends and bottlings whose composition equals the walk over the edges", () => {
    expect(one.counts.blendsOfBlends).toBeGreaterThan(0);
    expect(one.walked).toBeGreaterThan(10);
    expect(one.walkDifference).toBeLessThan(1e-9);
    expect(two.walkDifference).toBeLessThan(1e-9);
  });

  it("gives every bottling the key dates of every lot behind it, though it looks up only the kinds a dated step makes", () => {
    expect(one.datedBottlings).toBeGreaterThan(10);
    expect(one.datesDiffering).toEqual([]);
    expect(two.datesDiffering).toEqual([]);
  });

  it("is deterministic for a seed and grows season by season, linked by aged stock", () => {
    expect(again.lots).toBe(one.lots);
    expect(again.counts.compositionRows).toBe(one.counts.compositionRows);
    // Each season is drawn from the same shape; only aged stock links one season to the next.
    for (const key of ["lots", "edges", "events"] as const) {
      expect(two.counts[key] / one.counts[key], key).toBeGreaterThan(1.6);
      expect(two.counts[key] / one.counts[key], key).toBeLessThan(2.4);
    }
    expect(one.multiSeasonBlends).toBe(0);
    expect(two.multiSeasonBlends).toBeGreaterThan(0);
  });
});
