import "server-only";
import { eq, inArray, sql } from "drizzle-orm";
import { attachments, lots } from "@/db/schema";
import { assessCategories, type CategoryFacts, type Reason } from "@/domain/categories";
import { lowestGrade, type Grade } from "@/domain/grades";
import { getDb } from "../platform/db";
import { invalid } from "../platform/errors";
import { addedAlcohol, kojiFraction } from "../floor/tanks";
import { sourcesOf, traceHead } from "./trace";
import type { SessionUser } from "../accounts/session";
import type { Translate } from "@/lib/validation/field-errors";

const CLAIMABLE = ["tank", "sake", "blend", "bottled"];

/**
 * Lots of one kind behind a lot, by the fraction of its content they gave, walking the
 * lineage up until that kind. Reversed edges cancel in the sums, so corrected links drop out.
 */
export function ancestorsOfKind(lotId: number, kind: "tank" | "polished") {
  return getDb().all<{ id: number; code: string; contentIn: number; attributes: string; polishingRatioPct: number | null }>(sql`
    with recursive up(lot_id, frac) as (
      select ${lotId}, 1.0
      union all
      select e.parent_lot_id, up.frac * e.weight / c.content_in
      from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = up.lot_id
      where c.kind not in (${kind}, 'harvest') and c.content_in > 0
    )
    select l.id, l.code, l.content_in as contentIn, l.attributes, l.polishing_ratio_pct as polishingRatioPct
    from up join lots l on l.id = up.lot_id
    where l.kind = ${kind}
    group by l.id having abs(sum(up.frac)) > 1e-9`);
}

/** The least-polished rice in a tank: its label may claim no better ratio. */
function highestPolishingRatio(tankId: number): number | null {
  const ratios = ancestorsOfKind(tankId, "polished").map((p) => p.polishingRatioPct).filter((r): r is number => r !== null);
  return ratios.length ? Math.max(...ratios) : null;
}

/**
 * Harvest lots graded "equivalent" that carry no attachment: the certificate of equivalence
 * (any file attached to the harvest lot) is what lets such rice count as 3rd grade or better.
 */
function uncertifiedEquivalentLots(codes: string[]): string[] {
  if (!codes.length) return [];
  const certified = new Set(
    getDb().selectDistinct({ code: lots.code }).from(lots).innerJoin(attachments, eq(attachments.lotId, lots.id)).where(inArray(lots.code, codes)).all().map((r) => r.code),
  );
  return codes.filter((c) => !certified.has(c)).sort();
}

export function tankFacts(tank: { id: number; contentIn: number; attributes: string }): CategoryFacts {
  const sources = sourcesOf(tank.id, tank.contentIn);
  const grades = sources.map((s) => s.grade).filter((g): g is Grade => g !== null);
  const alcohol = addedAlcohol(tank.id);
  const attributes = JSON.parse(tank.attributes) as { ginjoMethod?: boolean; specialMethod?: boolean };
  return {
    polishingRatioPct: highestPolishingRatio(tank.id),
    kojiRatioPct: tank.contentIn > 0 ? kojiFraction(tank.id) * 100 : null,
    lowestGrade: lowestGrade(grades),
    addedAlcoholKg: alcohol.kg,
    addedAlcohol95Kg: alcohol.kg95,
    polishedRiceKg: tank.contentIn,
    ginjoMethod: attributes.ginjoMethod === true,
    specialMethod: attributes.specialMethod === true,
    uncertifiedEquivalentLots: uncertifiedEquivalentLots(sources.filter((s) => s.grade === "equivalent").map((s) => s.code)),
  };
}

/**
 * Premium-category eligibility from the actual lineage. A lot from several tanks earns a
 * category only if every tank behind it does; its figures are the least favourable ones.
 */
export function claimsFor(actor: SessionUser, code: string, t: Translate) {
  return claimsForLot(traceHead(actor, code), t);
}

/** The same, for a lot already found (the public bottle page has no signed-in actor). */
export function claimsForLot(lot: { id: number; code: string; kind: string }, t: Translate) {
  if (!CLAIMABLE.includes(lot.kind)) throw invalid({ code: [t("validation.notClaimable")] }, "errors.notClaimable");
  const tanks = ancestorsOfKind(lot.id, "tank").map((tank) => ({ code: tank.code, facts: tankFacts(tank) }));
  const verdicts = tanks.map((x) => assessCategories(x.facts));
  // A grade travels as its code (out-of-grade); the reader sees the grade's name.
  const word = (r: Reason) => t(`claims.reasons.${r.key}`, r.values && "grade" in r.values ? { ...r.values, grade: t(`lot.grades.${String(r.values.grade)}`) } : r.values);
  const categories = (verdicts[0] ?? assessCategories(emptyFacts)).map((v, n) => {
    const reasons = [...new Set(verdicts.flatMap((per, i) => per[n]!.reasons.map((r) => (tanks.length > 1 ? t("claims.ofTank", { tank: tanks[i]!.code, reason: word(r) }) : word(r)))))];
    return { name: v.name, eligible: verdicts.length > 0 && reasons.length === 0, reasons: verdicts.length ? reasons : [t("claims.reasons.noTank")] };
  });
  const facts = tanks.map((x) => x.facts);
  // Two at a time: handed to reduce directly, Math.min would also weigh the index and the array.
  const worst = <T,>(values: T[], pick: (a: T, b: T) => T) => (values.length ? values.reduce((a, b) => pick(a, b)) : null);
  return {
    lot: { code: lot.code, kind: lot.kind },
    polishingRatioPct: worst(facts.map((f) => f.polishingRatioPct).filter((v): v is number => v !== null), Math.max),
    kojiRatioPct: worst(facts.map((f) => f.kojiRatioPct).filter((v): v is number => v !== null), Math.min),
    lowestGrade: lowestGrade(facts.map((f) => f.lowestGrade).filter((g): g is Grade => g !== null)),
    addedAlcoholKg: facts.reduce((a, f) => a + f.addedAlcoholKg, 0),
    // Extension: the same converted to 95 % alcohol, the weight the 10 % limit is judged on.
    addedAlcohol95Kg: facts.reduce((a, f) => a + f.addedAlcohol95Kg, 0),
    ginjoMethod: facts.length > 0 && facts.every((f) => f.ginjoMethod),
    tanks: tanks.map((x) => ({ code: x.code, ...x.facts })),
    categories,
    caution: t("caution.labelling"),
  };
}

const emptyFacts: CategoryFacts = { polishingRatioPct: null, kojiRatioPct: null, lowestGrade: null, addedAlcoholKg: 0, addedAlcohol95Kg: 0, polishedRiceKg: 0, ginjoMethod: false };
