import "server-only";
import { sql } from "drizzle-orm";
import type { CategoryFacts } from "@/domain/categories";
import { lowestGrade, type Grade } from "@/domain/grades";
import { getDb } from "../platform/db";
import { addedAlcoholOf } from "../floor/tanks";
import { fractionsUp, lotsOfKindUp, shareOfKind, type Ancestry } from "./ancestry";
import { KeptByLot, type Worked } from "./kept-by-lot";

export type TankLot = { id: number; code: string; contentIn: number; attributes: string | null };

type Source = { id: number; code: string; grade: string | null };

/** Harvest lots in each tank with their grade: the composition rows, read for all tanks at once. */
function gradedSources(tanks: TankLot[]): Map<number, Source[]> {
  const ids = tanks.filter((t) => t.contentIn > 0).map((t) => t.id);
  const rows = getDb().all<{ tank: number } & Source>(sql`
    select d.lot_id as tank, s.id, s.code, s.grade
    from (select lot_id, source_lot_id, sum(amount) as amount from lot_source_deltas
          where lot_id in (select value from json_each(${JSON.stringify(ids)})) group by lot_id, source_lot_id) d
    join lots s on s.id = d.source_lot_id
    where abs(d.amount) > 1e-9`);
  const byTank = new Map<number, Source[]>();
  for (const { tank, ...source } of rows) (byTank.get(tank) ?? byTank.set(tank, []).get(tank)!).push(source);
  return byTank;
}

/** Harvest lots with any file attached: the certificate of equivalence lets "equivalent" rice count as 3rd grade or better. */
function certified(codes: string[]): Set<string> {
  if (!codes.length) return new Set();
  const rows = getDb().all<{ code: string }>(sql`
    select distinct l.code from lots l join attachments a on a.lot_id = l.id
    where l.code in (select value from json_each(${JSON.stringify(codes)}))`);
  return new Set(rows.map((r) => r.code));
}

/** The least-polished rice in a tank: its label may claim no better ratio. */
function highestPolishingRatio(ancestry: Ancestry, tankId: number): number | null {
  const ratios = lotsOfKindUp(ancestry, tankId, "polished").map((p) => p.polishingRatioPct).filter((r): r is number => r !== null);
  return ratios.length ? Math.max(...ratios) : null;
}

/** The walks a tank's facts are read from: up to its polished rice, and up to its koji (the walk of `kojiFraction`). */
const POLISHED = ["polished"];
const KOJI = ["koji", "polished"];

/**
 * The category facts of each tank, from lineage already read (`ancestry` must reach each tank's
 * rice) and three reads for all tanks together, instead of a walk and four reads per tank.
 */
function judge(tanks: TankLot[], ancestry: Ancestry): Map<number, Worked<CategoryFacts>> {
  const sources = gradedSources(tanks);
  const alcohol = addedAlcoholOf(tanks.map((t) => t.id));
  const equivalent = (id: number) => (sources.get(id) ?? []).filter((s) => s.grade === "equivalent").map((s) => s.code);
  const withCertificate = certified([...new Set(tanks.flatMap((t) => equivalent(t.id)))]);
  return new Map(
    tanks.map((tank) => {
      const attributes = JSON.parse(tank.attributes ?? "{}") as { ginjoMethod?: boolean; specialMethod?: boolean };
      const added = alcohol.get(tank.id) ?? { kg: 0, kg95: 0 };
      const facts: CategoryFacts = {
        polishingRatioPct: highestPolishingRatio(ancestry, tank.id),
        kojiRatioPct: tank.contentIn > 0 ? shareOfKind(ancestry, fractionsUp(ancestry, tank.id, KOJI), "koji") * 100 : null,
        lowestGrade: lowestGrade((sources.get(tank.id) ?? []).map((s) => s.grade).filter((g): g is Grade => g !== null)),
        addedAlcoholKg: added.kg,
        addedAlcohol95Kg: added.kg95,
        polishedRiceKg: tank.contentIn,
        ginjoMethod: attributes.ginjoMethod === true,
        specialMethod: attributes.specialMethod === true,
        uncertifiedEquivalentLots: Object.freeze(equivalent(tank.id).filter((c) => !withCertificate.has(c)).sort()) as string[],
      };
      // What they rest on: the tank and every lot its walks reached (the walk to its koji stops
      // sooner than the walk to its polished rice, so the longer one reaches them all), and the
      // harvest lots in it.
      const { places } = fractionsUp(ancestry, tank.id, POLISHED);
      const harvests = sources.get(tank.id) ?? [];
      const on = new Int32Array(places.length + harvests.length);
      for (let i = 0; i < places.length; i++) on[i] = ancestry.ids[places[i]!]!;
      harvests.forEach((source, i) => (on[places.length + i] = source.id));
      return [tank.id, { value: Object.freeze(facts), on }];
    }),
  );
}

/** Facts judged, kept across lineages (a house blend's bottlings share their tanks); see KeptByLot for what they rest on. */
const kept = new KeptByLot<CategoryFacts>("tank facts", 20_000);

/**
 * The category facts of each tank: those kept where nothing they rest on changed since, the
 * others judged from `ancestry` and kept.
 */
export function tankFactsOf(tanks: TankLot[], ancestry: Ancestry): Map<number, CategoryFacts> {
  const byId = new Map(tanks.map((t) => [t.id, t]));
  return kept.of([...byId.keys()], ancestry.mark, (missing) => judge(missing.map((id) => byId.get(id)!), ancestry));
}

/** The facts judged from `ancestry` now, nothing kept used: what the tests hold the kept ones to. */
export function tankFactsJudgedAnew(tanks: TankLot[], ancestry: Ancestry): Map<number, CategoryFacts> {
  return new Map([...judge(tanks, ancestry)].map(([tank, judged]) => [tank, judged.value]));
}
