import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { originsByWeight, originStatement, sharesBy } from "@/domain/origin";
import { STEP_RULES } from "@/domain/steps";
import { ancestryOf, lotOf, lotsOfKindUp, lotsUpThrough, type Ancestry } from "./ancestry";
import { claimedCategories, type ClaimedCategories } from "./claims";
import { KeptByLot, type Worked } from "./kept-by-lot";
import { getDb } from "../platform/db";
import { notFound } from "../platform/errors";
import { productOfLot } from "../ledger/products";
import { sourcesOf, traceHead } from "./trace";
import type { SessionUser } from "../accounts/session";

const CLAIMABLE = ["tank", "sake", "blend", "bottled"];

type Head = { id: number; code: string; kind: string; contentIn: number };

/** Lots of these kinds pass their parents' dates on: a bottling's blends, sake and tanks, up to each tank's additions. */
const DATED_THROUGH = ["bottled", "blend", "sake", "tank"];
const DATED_STEPS = ["mash-addition", "pressing", "bottling"] as const;
/** Only lots of these kinds come out of a dated step (the steps' output kinds, held at every write): the others are not looked up. */
const DATED_KINDS = new Set<string>(DATED_STEPS.flatMap((step) => STEP_RULES[step].outputKinds));

/** `iso` is made once, with the figure: inside a page, Next wraps the Date constructor, and a blend's 1,000 dates cost 2 ms. */
type Dated = { step: string; at: number; iso: string };
/** Each dated lot's first uncorrected event of each dated step: it rests on the lot alone (an event into it, or a correction's draw from it, names it). */
const datesKept = new KeptByLot<Dated[]>(100_000);

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
function keyDates(lotId: number, ancestry: Ancestry) {
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

function namedGrowers(lotId: number, contentIn: number) {
  const sources = sourcesOf(lotId, contentIn);
  const consent = new Map(
    getDb()
      .all<{ id: string; named: number }>(sql`select id, named_publicly as named from parties where kind = 'grower'`)
      .map((p) => [p.id, p.named === 1]),
  );
  // Growers who have not agreed to be named are counted, never named.
  const growers = sharesBy(sources, (s) => (consent.get(s.grower.id) ? s.grower.name : ""), (s) => s.share);
  return { sources, growers: growers.map((g) => ({ name: g.name || null, share: g.share })) };
}

/** The provenance answer for any lot: what sales tell a buyer, built from the lineage. */
export function provenanceOf(head: Head, claims: ClaimedCategories | null, ancestry: Ancestry = ancestryOf(head.id)) {
  const { sources, growers } = namedGrowers(head.id, head.contentIn);
  const ratios = [...new Set(lotsOfKindUp(ancestry, head.id, "polished").map((p) => p.polishingRatioPct).filter((r): r is number => r !== null))];
  return {
    lot: { code: head.code, kind: head.kind },
    varieties: sharesBy(sources, (s) => s.variety ?? "unknown", (s) => s.share),
    cropYears: [...new Set(sources.map((s) => s.cropYear).filter((y): y is number => y !== null))].sort(),
    origins: originsByWeight(sources.map((s) => ({ region: s.field?.region ?? null, share: s.share }))),
    originStatement: originStatement(sources.map((s) => ({ region: s.field?.region ?? null, share: s.share }))),
    growers,
    polishingRatiosPct: ratios.sort((a, b) => a - b),
    kojiRatioPct: claims?.kojiRatioPct ?? null,
    categories: claims?.eligible ?? [],
    product: productOfLot(head.id, claims?.eligible ?? null),
    ...keyDates(head.id, ancestry),
    shares: sources.length,
  };
}
export type Provenance = ReturnType<typeof provenanceOf>;

export function provenanceFor(actor: SessionUser, code: string): Provenance {
  const head = traceHead(actor, code);
  // The claims and the card read the same lineage: it is walked once.
  const ancestry = ancestryOf(head.id);
  return provenanceOf(head, CLAIMABLE.includes(head.kind) ? claimedCategories(head.id, ancestry) : null, ancestry);
}

/**
 * The public page of a bottling, reached from the bottle's GS1 Digital Link QR. Only a
 * bottled lot whose GTIN matches answers; anything else is "not found".
 */
export function findBottling(gtin14: string, lotCode: string) {
  const row = getDb().get<{ id: number; code: string; kind: string; contentIn: number; gtin: string; bottleMl: number; quantity: number }>(sql`
    select id, code, kind, content_in as contentIn, json_extract(attributes, '$.gtin') as gtin, json_extract(attributes, '$.bottleMl') as bottleMl, quantity_in as quantity
    from lots where code = ${lotCode} and kind = 'bottled'`);
  if (!row || String(row.gtin).padStart(14, "0") !== gtin14) throw notFound("errors.bottlingNotFound");
  return row;
}

export function publicProvenance(gtin14: string, lotCode: string) {
  const bottling = findBottling(gtin14, lotCode);
  const ancestry = ancestryOf(bottling.id);
  return { bottling, provenance: provenanceOf(bottling, claimedCategories(bottling.id, ancestry), ancestry) };
}
