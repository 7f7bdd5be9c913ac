import "server-only";
import { assessCategories, type CategoryFacts, type Reason } from "@/domain/categories";
import { lowestGrade, type Grade } from "@/domain/grades";
import { invalid } from "../platform/errors";
import { ancestryOf, lotsOfKindUp, type Ancestry } from "./ancestry";
import { tankFactsOf } from "./tank-facts";
import { traceHead } from "./trace";
import type { SessionUser } from "../accounts/session";
import type { Translate } from "@/lib/validation/field-errors";

const CLAIMABLE = ["tank", "sake", "blend", "bottled"];

/**
 * Premium-category eligibility from the actual lineage. A lot from several tanks earns a
 * category only if every tank behind it does; its figures are the least favourable ones.
 */
export function claimsFor(actor: SessionUser, code: string, t: Translate) {
  return claimsForLot(traceHead(actor, code), t);
}

/** The same, for a lot already found (the public bottle page has no signed-in actor). */
export function claimsForLot(lot: { id: number; code: string; kind: string }, t: Translate, ancestry?: Ancestry) {
  if (!CLAIMABLE.includes(lot.kind)) throw invalid({ code: [t("validation.notClaimable")] }, "errors.notClaimable");
  const { tanks, verdicts, earned, figures } = judgeLot(lot.id, ancestry ?? ancestryOf(lot.id));
  // A grade travels as its code (out-of-grade); the reader sees the grade's name.
  const word = (r: Reason) => t(`claims.reasons.${r.key}`, r.values && "grade" in r.values ? { ...r.values, grade: t(`lot.grades.${String(r.values.grade)}`) } : r.values);
  const categories = (verdicts[0] ?? assessCategories(emptyFacts)).map((v, n) => {
    const reasons = [...new Set(verdicts.flatMap((per, i) => per[n]!.reasons.map((r) => (tanks.length > 1 ? t("claims.ofTank", { tank: tanks[i]!.code, reason: word(r) }) : word(r)))))];
    return { name: v.name, eligible: earned[n]!, reasons: verdicts.length ? reasons : [t("claims.reasons.noTank")] };
  });
  return {
    lot: { code: lot.code, kind: lot.kind },
    ...figures,
    tanks: tanks.map((x) => ({ code: x.code, ...x.facts })),
    categories,
    caution: t("caution.labelling"),
  };
}

/**
 * The categories every tank behind a lot earns and the figures they were judged on, without the
 * reasons worded: what the provenance card needs (it names only the categories earned). Wording
 * every reason of every tank in the reader's language was a quarter of the bottle page's time.
 */
export function claimedCategories(lotId: number, ancestry: Ancestry) {
  const { verdicts, earned, figures } = judgeLot(lotId, ancestry);
  return { kojiRatioPct: figures.kojiRatioPct, eligible: (verdicts[0] ?? []).filter((_, n) => earned[n]).map((v) => v.name) };
}
export type ClaimedCategories = ReturnType<typeof claimedCategories>;

/** A tank's verdict, made once for each facts judged: kept facts are the same object until they change. */
const verdicts = new WeakMap<CategoryFacts, ReturnType<typeof assessCategories>>();
function verdictOn(facts: CategoryFacts) {
  return verdicts.get(facts) ?? verdicts.set(facts, assessCategories(facts)).get(facts)!;
}

function judgeLot(lotId: number, behind: Ancestry) {
  const tankLots = lotsOfKindUp(behind, lotId, "tank");
  const factsOf = tankFactsOf(tankLots, behind);
  const tanks = tankLots.map((tank) => ({ code: tank.code, facts: factsOf.get(tank.id)! }));
  const verdicts = tanks.map((x) => verdictOn(x.facts));
  // A category is earned when every tank behind the lot earns it, and there is a tank.
  const earned = (verdicts[0] ?? assessCategories(emptyFacts)).map((_, n) => verdicts.length > 0 && verdicts.every((per) => per[n]!.reasons.length === 0));
  const facts = tanks.map((x) => x.facts);
  // Two at a time: handed to reduce directly, Math.min would also weigh the index and the array.
  const worst = <T,>(values: T[], pick: (a: T, b: T) => T) => (values.length ? values.reduce((a, b) => pick(a, b)) : null);
  const figures = {
    polishingRatioPct: worst(facts.map((f) => f.polishingRatioPct).filter((v): v is number => v !== null), Math.max),
    kojiRatioPct: worst(facts.map((f) => f.kojiRatioPct).filter((v): v is number => v !== null), Math.min),
    lowestGrade: lowestGrade(facts.map((f) => f.lowestGrade).filter((g): g is Grade => g !== null)),
    addedAlcoholKg: facts.reduce((a, f) => a + f.addedAlcoholKg, 0),
    // Extension: the same converted to 95 % alcohol, the weight the 10 % limit is judged on.
    addedAlcohol95Kg: facts.reduce((a, f) => a + f.addedAlcohol95Kg, 0),
    ginjoMethod: facts.length > 0 && facts.every((f) => f.ginjoMethod),
  };
  return { tanks, verdicts, earned, figures };
}

const emptyFacts: CategoryFacts = { polishingRatioPct: null, kojiRatioPct: null, lowestGrade: null, addedAlcoholKg: 0, addedAlcohol95Kg: 0, polishedRiceKg: 0, ginjoMethod: false };
