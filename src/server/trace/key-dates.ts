import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { STEP_RULES } from "@/domain/steps";
import { getDb } from "../platform/db";
import { lotOf, lotsUpThrough, type Ancestry } from "./ancestry";
import type { LedgerMark } from "./edge-index";
import { KeptByLot, type Worked } from "./kept-by-lot";

/** Lots of these kinds pass their parents' dates on: a bottling's blends, sake and tanks, up to each tank's additions. */
const DATED_THROUGH = ["bottled", "blend", "sake", "tank"];
const DATED_STEPS = ["mash-addition", "pressing", "bottling"] as const;
/** Only lots of these kinds come out of a dated step (the steps' output kinds, held at every write): the others are not looked up. */
export const DATED_KINDS = new Set<string>(DATED_STEPS.flatMap((step) => STEP_RULES[step].outputKinds));

/** `iso` is made once, with the figure: inside a page, Next wraps the Date constructor, and a blend's 1,000 dates cost 2 ms. */
type Dated = { step: string; at: number; iso: string };
/** Each dated lot's first uncorrected event of each dated step: it rests on the lot alone (an event into it, or a correction's draw from it, names it). */
const datesKept = new KeptByLot<Dated[]>("key dates", 100_000);

/** Keeps the dates of these lots (of the dated kinds) as the ledger stands at `mark`: the warm-up's share. */
export function keepDatesOf(lots: number[], mark: LedgerMark) {
  datesKept.of(lots, mark, datedSteps);
}

/** The dated steps of each lot: the first uncorrected event of each that made it. */
function datedSteps(lots: number[]): Map<number, Worked<Dated[]>> {
  const byLot = new Map<number, Worked<Dated[]>>(lots.map((id) => [id, { value: [], on: [id] }]));
  for (const row of datesOf(sql`select value as lot_id from json_each(${JSON.stringify(lots)})`)) byLot.get(row.lot)!.value.push({ step: row.step, at: row.at, iso: row.iso });
  return byLot;
}

function datesOf(up: SQL): (Dated & { lot: number })[] {
  const rows = getDb().all<{ lot: number; step: string; at: number }>(sql`
    select up.lot_id as lot, ev.step, min(ev.at) as at from (${up}) up
    join event_outputs o on o.lot_id = up.lot_id
    join events ev on ev.id = o.event_id
    where ev.step in (select value from json_each(${JSON.stringify(DATED_STEPS)})) and not exists (select 1 from events c where c.corrects = ev.id)
    group by ev.step, up.lot_id`);
  return rows.map((row) => ({ ...row, iso: new Date(row.at).toISOString() }));
}

/** Dates that matter to a buyer: mash additions of the tanks behind a lot, pressing, bottling. */
export function keyDates(lotId: number, ancestry: Ancestry) {
  // The lots come from the lineage already read; SQLite walks them itself only where that read stopped short.
  const lots = lotsUpThrough(ancestry, lotId, DATED_THROUGH)?.filter((id) => DATED_KINDS.has(lotOf(ancestry, id)!.kind));
  const rows = lots
    ? [...datesKept.of(lots, ancestry.mark, datedSteps).values()].flat()
    : datesOf(sql`with recursive up(lot_id) as (
        select ${lotId}
        union
        select e.parent_lot_id from up join lineage_edges e on e.child_lot_id = up.lot_id
        join lots c on c.id = up.lot_id where c.kind in ('bottled', 'blend', 'sake', 'tank')
      ) select lot_id from up`);
  rows.sort((a, b) => a.at - b.at);
  const of = (step: string) => rows.filter((r) => r.step === step).map((r) => r.iso);
  return { brewedOn: of("mash-addition"), pressedOn: of("pressing"), bottledOn: of("bottling") };
}
