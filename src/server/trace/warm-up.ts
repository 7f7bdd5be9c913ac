import "server-only";
import { sql } from "drizzle-orm";
import { getDb, getSqlite } from "../platform/db";
import { ancestryReadAnew, lotsOfKindUp } from "./ancestry";
import { ledgerMark } from "./edge-index";
import { DATED_KINDS, keepDatesOf } from "./key-dates";
import { tankFactsOf } from "./tank-facts";

/**
 * Working out in the background, after a start, what a bottle's first view would otherwise work
 * out while the buyer waits: every tank's category facts and every dated lot's dates (kept as
 * src/server/trace/kept-by-lot.ts keeps them). The first house blend viewed after a restart judged
 * its 530 tanks on the spot: 40 ms in-process, and its page missed 50 ms. Set going by the first
 * provenance answer (in the app's own copy of these modules, whose figures the pages read), it runs
 * in slices of at most SLICE_MS between requests, and stops when the database is another (a
 * test's own file), on an error (logged; what is kept stays right), or with GRAINLINE_WARM=0.
 * Its slices hold the process open until it is done (a second or two on the bench's ledger): an
 * unref'd slice waits for the next event of an idle server, and the warm-up took minutes.
 */
const SLICE_MS = 4;
const DATES_AT_ONCE = 200;
let started: Promise<void> | undefined;

export function warmInBackground(): Promise<void> {
  if (started || process.env.GRAINLINE_WARM === "0" || getSqlite().inTransaction) return started ?? Promise.resolve();
  const sqlite = getSqlite();
  const tanks = getDb().all<{ id: number }>(sql`select id from lots where kind = 'tank' order by id`).map((r) => r.id);
  const dated = getDb()
    .all<{ id: number }>(sql`select id from lots where kind in (select value from json_each(${JSON.stringify([...DATED_KINDS])})) order by id`)
    .map((r) => r.id);
  let [tank, date] = [0, 0];
  started = new Promise<void>((done) => {
    const slice = () => {
      try {
        if (getSqlite() !== sqlite) return done();
        const until = performance.now() + SLICE_MS;
        while (performance.now() < until) {
          if (tank < tanks.length) {
            const id = tanks[tank++]!;
            const ancestry = ancestryReadAnew(id);
            tankFactsOf(lotsOfKindUp(ancestry, id, "tank"), ancestry);
          } else if (date < dated.length) {
            keepDatesOf(dated.slice(date, (date += DATES_AT_ONCE)), ledgerMark());
          } else return done();
        }
        setImmediate(slice);
      } catch (error) {
        console.error("warming the trace figures stopped:", error);
        done();
      }
    };
    setImmediate(slice);
  });
  return started;
}
