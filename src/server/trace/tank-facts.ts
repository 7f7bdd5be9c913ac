import "server-only";
import { sql } from "drizzle-orm";
import type { CategoryFacts } from "@/domain/categories";
import { lowestGrade, type Grade } from "@/domain/grades";
import { getDb } from "../platform/db";
import { addedAlcoholOf } from "../floor/tanks";
import { fractionsUp, lotsOfKindUp, shareOfKind, type Ancestry } from "./ancestry";

export type TankLot = { id: number; code: string; contentIn: number; attributes: string | null };

/** Harvest lots in each tank with their grade: the composition rows, read for all tanks at once. */
function gradedSources(tanks: TankLot[]): Map<number, { code: string; grade: string | null }[]> {
  const ids = tanks.filter((t) => t.contentIn > 0).map((t) => t.id);
  const rows = getDb().all<{ tank: number; code: string; grade: string | null }>(sql`
    select d.lot_id as tank, s.code, s.grade
    from (select lot_id, source_lot_id, sum(amount) as amount from lot_source_deltas
          where lot_id in (select value from json_each(${JSON.stringify(ids)})) group by lot_id, source_lot_id) d
    join lots s on s.id = d.source_lot_id
    where abs(d.amount) > 1e-9`);
  const byTank = new Map<number, { code: string; grade: string | null }[]>();
  for (const r of rows) (byTank.get(r.tank) ?? byTank.set(r.tank, []).get(r.tank)!).push({ code: r.code, grade: r.grade });
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

/** Share of a tank's rice that passed through koji (the walk of `kojiFraction`, on lineage already read). */
function kojiShare(ancestry: Ancestry, tankId: number): number {
  return shareOfKind(ancestry, fractionsUp(ancestry, tankId, ["koji", "polished"]), "koji");
}

/**
 * The category facts of each tank, from lineage already read (`ancestry` must reach each tank's
 * rice) and three reads for all tanks together, instead of a walk and four reads per tank.
 */
export function tankFactsOf(tanks: TankLot[], ancestry: Ancestry): Map<number, CategoryFacts> {
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
        kojiRatioPct: tank.contentIn > 0 ? kojiShare(ancestry, tank.id) * 100 : null,
        lowestGrade: lowestGrade((sources.get(tank.id) ?? []).map((s) => s.grade).filter((g): g is Grade => g !== null)),
        addedAlcoholKg: added.kg,
        addedAlcohol95Kg: added.kg95,
        polishedRiceKg: tank.contentIn,
        ginjoMethod: attributes.ginjoMethod === true,
        specialMethod: attributes.specialMethod === true,
        uncertifiedEquivalentLots: equivalent(tank.id).filter((c) => !withCertificate.has(c)).sort(),
      };
      return [tank.id, facts];
    }),
  );
}
