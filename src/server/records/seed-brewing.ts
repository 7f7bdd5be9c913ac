import "server-only";
import { eq } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { lots } from "@/db/schema";
import { translator } from "@/i18n/messages";
import type { EventInput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import { applyEvent } from "../ledger/events";
import { registerHarvestInTx } from "../ledger/harvests";
import { seedMasterList } from "../floor/master-lists";
import type { SessionUser } from "../accounts/session";

type Users = Record<"admin" | "grower" | "grower2" | "miller" | "brewer", SessionUser>;
const r1 = (x: number) => Math.round(x * 10) / 10;
const day = (start: string, plus: number) => {
  const d = new Date(`${start}T08:30:00+09:00`);
  d.setUTCDate(d.getUTCDate() + plus);
  return d.toISOString();
};

/**
 * The invented 2024–25 season, finished: rice grown and polished in autumn 2024, three
 * tanks brewed over the winter, pressed, one blend, and bottlings with GTINs from GS1's
 * example range (950 prefix, as in GS1's own documentation) — never a real product's. Weights
 * follow common practice (koji rice about a fifth of the rice, starter about 7 %, the three
 * additions growing about 1 : 2 : 4, water about 130 % of the rice).
 */
export function seedBrewSeason(tx: DbOrTx, u: Users) {
  const en = translator("en");
  const t: Translate = (key, values) => en(key as never, values as never);
  const rec = (actor: SessionUser, input: Partial<EventInput> & { step: EventInput["step"] }) =>
    applyEvent(tx, actor, { inputs: [], outputs: [], measurements: [], ...input } as EventInput, t);
  const first = (res: { outputs: { code: string }[] }) => res.outputs[0]!.code;
  // A receipt answers the sender's dispatch, sent early the same day with its slip.
  const dispatch = (actor: SessionUser, lot: string, kg: number, to: string, slip: string, at: string, partyId?: string) =>
    rec(actor, { step: "shipping", at: new Date(Date.parse(at) - 3 * 3_600_000).toISOString(), inputs: [{ lot, quantity: kg }], counterpartyId: to, partyId, referenceDoc: slip });
  const m = (name: string, value: number, unit: string) => ({ name, value: r1(value), unit });

  const harvest = (actor: SessionUser, fieldId: string, variety: string, kg: number, grade: string, date: string) =>
    registerHarvestInTx(tx, actor, { fieldId, variety, cropYear: 2024, brownKg: kg, moisturePct: 14.8, grade: grade as never, bags: Math.round(kg / 30), at: `${date}T10:00:00+09:00` }, t).code;
  const a = harvest(u.grower, "field-ikeda-terrace", "Yamada Nishiki", 1500, "1", "2024-09-25");
  const b = harvest(u.admin, "field-coop-north", "Yamada Nishiki", 1000, "tokuto", "2024-09-30");
  const c = harvest(u.grower2, "field-nakase-river", "Omachi", 1800, "2", "2024-10-05");
  for (const [lot, kg, n] of [[a, 1500, 1], [b, 1000, 2], [c, 1800, 3]] as const) {
    dispatch(n === 3 ? u.grower2 : n === 2 ? u.admin : u.grower, lot, kg, "mill-shirotae", `DS-2024-0${n}`, `2024-10-1${n}T10:00:00+09:00`, n === 2 ? "grower-coop" : undefined);
    rec(u.miller, { step: "receiving", at: `2024-10-1${n}T10:00:00+09:00`, inputs: [{ lot, quantity: kg }], referenceDoc: `DS-2024-0${n}`, place: "Shirotae mill yard" });
  }
  // A run of two varieties is confirmed as such (the polished lot keeps both with their shares).
  const polish = (date: string, inputs: [string, number][], out: number, bran: number, target: number, mixed = false) => {
    const run = rec(u.miller, { step: "polishing", at: `${date}T10:00:00+09:00`, ...(mixed ? { attributes: { mixedVarietiesConfirmed: true } } : {}), inputs: inputs.map(([lot, quantity]) => ({ lot, quantity })), outputs: [{ kind: "polished", quantity: out }, { kind: "bran", quantity: bran }], measurements: [{ name: "targetPolishingRatioPct", value: target, unit: "%" }] });
    const code = first(run);
    dispatch(u.miller, code, out, "brewery-kirinoha", `SH-${code}`, day(date, 6));
    rec(u.brewer, { step: "receiving", at: day(date, 6), inputs: [{ lot: code, quantity: out }], referenceDoc: `SH-${code}`, place: "Kirinoha rice store" });
    return code;
  };
  const p50 = polish("2024-10-28", [[a, 1500], [b, 500]], 1000, 960, 50);
  const p60 = polish("2024-11-04", [[b, 500], [c, 1800]], 1380, 880, 60, true);
  // The tank register (invented locations and sizes); a first addition names its tank from it.
  const tank = (n: string, name: string, capacityL: number, location: string) => ({ id: `tank-${n}`, name, capacityL, location, active: true });
  const register = [tank("1", "Tank 1", 3000, "North cellar"), tank("2", "Tank 2", 3000, "North cellar"), tank("3", "Tank 3", 2500, "North cellar"), tank("4", "Tank 4", 4000, "Cold room"), tank("5", "Tank 5", 4000, "Cold room"), tank("6", "Small tank A", 800, "Cold room")];
  seedMasterList(tx, "tankRegister", register, u.admin.id);

  /** One tank from its first soak to pressing, scaled to `rice` kg of polished rice. */
  const brewTank = (polished: string, rice: number, start: string, name: string, ginjo: boolean, alcoholKg: number) => {
    const soakKoji = first(rec(u.brewer, { step: "soaking", at: day(start, 0), inputs: [{ lot: polished, quantity: 0.2 * rice }], outputs: [{ kind: "soaked", quantity: r1(0.2 * rice * 1.32), use: "koji" }], measurements: [m("soakMinutes", 12, "min"), m("waterTempC", 9, "°C")] }));
    const soakMash = first(rec(u.brewer, { step: "soaking", at: day(start, 0), inputs: [{ lot: polished, quantity: 0.8 * rice }], outputs: [{ kind: "soaked", quantity: r1(0.8 * rice * 1.27), use: "mash" }], measurements: [m("soakMinutes", 45, "min"), m("waterTempC", 9, "°C")] }));
    const stKoji = first(rec(u.brewer, { step: "steaming", at: day(start, 1), inputs: [{ lot: soakKoji, quantity: r1(0.2 * rice * 1.32) }], outputs: [{ kind: "steamed", quantity: r1(0.2 * rice * 1.38) }], measurements: [m("steamMinutes", 50, "min")] }));
    const stMashKg = r1(0.8 * rice * 1.36);
    const stMash = first(rec(u.brewer, { step: "steaming", at: day(start, 1), inputs: [{ lot: soakMash, quantity: r1(0.8 * rice * 1.27) }], outputs: [{ kind: "steamed", quantity: stMashKg }], measurements: [m("steamMinutes", 55, "min")] }));
    const starterKg = r1(stMashKg * (0.07 / 0.8));
    const rest = stMashKg - starterKg;
    const parts = [r1(rest / 7), r1((2 * rest) / 7)];
    parts.push(r1(stMashKg - starterKg - parts[0]! - parts[1]!));
    const split = rec(u.brewer, { step: "splitting", at: day(start, 1), inputs: [{ lot: stMash, quantity: stMashKg }], outputs: [{ kind: "steamed", quantity: starterKg, use: "starter" }, ...["first", "middle", "final"].map((addition, n) => ({ kind: "steamed" as const, quantity: parts[n]!, use: "mash", addition }))] });
    const [forStarter, f, mid, fin] = split.outputs.map((o) => o.code);
    for (const [checkpoint, temp, h] of [["BringingIn", 34, 0], ["Inoculation", 30.5, 2], ["Rebreaking", 32, 20], ["Mounding", 36, 30], ["Finish", 40, 44]] as const) {
      rec(u.brewer, { step: "measuring", at: new Date(new Date(day(start, 1)).getTime() + h * 3_600_000).toISOString(), inputs: [{ lot: stKoji, quantity: 0 }], measurements: [m(`kojiTemp${checkpoint}`, temp, "°C")] });
    }
    const kojiKg = r1(0.2 * rice * 1.18);
    const koji = first(rec(u.brewer, { step: "koji-making", at: day(start, 3), inputs: [{ lot: stKoji, quantity: r1(0.2 * rice * 1.38) }], outputs: [{ kind: "koji", quantity: kojiKg }], measurements: [m("sporeG", rice / 10, "g")], attributes: { startedAt: day(start, 1) } }));
    const kojiPart = (share: number) => r1(kojiKg * share);
    const starterWater = 0.07 * rice * 1.1;
    const starter = first(rec(u.brewer, { step: "starter", at: day(start, 3), inputs: [{ lot: koji, quantity: kojiPart(0.1) }, { lot: forStarter!, quantity: starterKg }], outputs: [{ kind: "starter", quantity: r1(kojiPart(0.1) + starterKg + starterWater) }], measurements: [m("waterL", starterWater, "L")] }));
    const water = 1.3 * rice - starterWater;
    const tankKg1 = r1(kojiPart(0.1) + starterKg + starterWater + kojiPart(0.2) + parts[0]! + water / 7);
    const tank = first(rec(u.brewer, { step: "mash-addition", at: day(start, 17), attributes: { addition: "first" }, inputs: [{ lot: starter, quantity: r1(kojiPart(0.1) + starterKg + starterWater) }, { lot: koji, quantity: kojiPart(0.2) }, { lot: f!, quantity: parts[0]! }], outputs: [{ kind: "tank", quantity: tankKg1, tankName: name, ginjoMethod: ginjo }], measurements: [m("waterL", water / 7, "L")] }));
    rec(u.brewer, { step: "mash-addition", at: day(start, 19), attributes: { addition: "middle" }, inputs: [{ lot: koji, quantity: kojiPart(0.3) }, { lot: mid!, quantity: parts[1]! }], outputs: [{ lot: tank, quantity: r1(kojiPart(0.3) + parts[1]! + (2 * water) / 7) }], measurements: [m("waterL", (2 * water) / 7, "L")] });
    const lastKoji = r1(kojiKg - kojiPart(0.1) - kojiPart(0.2) - kojiPart(0.3));
    rec(u.brewer, { step: "mash-addition", at: day(start, 20), attributes: { addition: "final" }, inputs: [{ lot: koji, quantity: lastKoji }, { lot: fin!, quantity: parts[2]! }], outputs: [{ lot: tank, quantity: r1(lastKoji + parts[2]! + (4 * water) / 7) }], measurements: [m("waterL", (4 * water) / 7, "L")] });
    if (alcoholKg > 0) rec(u.brewer, { step: "measuring", at: day(start, 44), inputs: [{ lot: tank, quantity: 0 }], measurements: [m("addedAlcoholKg", alcoholKg, "kg"), m("addedAlcoholStrengthPct", 95, "%")] });
    return tank;
  };
  const press = (tank: string, onHand: number, rice: number, date: string) =>
    first(rec(u.brewer, { step: "pressing", at: `${date}T09:00:00+09:00`, inputs: [{ lot: tank, quantity: onHand }], outputs: [{ kind: "sake", quantity: r1(rice * 1.7) }, { kind: "lees", quantity: r1(rice * 0.35) }] }));
  const bottle = (lot: string, count: number, ml: number, gtin: string, date: string) =>
    first(rec(u.brewer, { step: "bottling", at: `${date}T09:00:00+09:00`, inputs: [{ lot, quantity: (count * ml) / 1000 }], outputs: [{ kind: "bottled", quantity: count, bottleMl: ml, gtin }] }));

  const t1 = brewTank(p50, 600, "2024-12-01", "Tank 1", true, 0);
  const t2 = brewTank(p60, 700, "2024-12-08", "Tank 2", true, 0);
  const t3 = brewTank(p60, 600, "2024-12-15", "Tank 3", false, 40);
  const onHand = (tank: string) => tx.select({ q: lots.onHand }).from(lots).where(eq(lots.code, tank)).get()!.q;
  const s1 = press(t1, onHand(t1), 600, "2025-01-20");
  const s2 = press(t2, onHand(t2), 700, "2025-01-28");
  const s3 = press(t3, onHand(t3), 600, "2025-02-04");
  bottle(s1, 800, 720, "9506000134352", "2025-03-02");
  bottle(s2, 300, 1800, "9506000134369", "2025-03-09");
  const blend = first(rec(u.brewer, { step: "blending", at: "2025-03-12T09:00:00+09:00", inputs: [{ lot: s2, quantity: 400 }, { lot: s3, quantity: 600 }], outputs: [{ kind: "blend", quantity: 1000 }] }));
  bottle(blend, 1000, 720, "9506000134376", "2025-03-16");
  rec(u.brewer, { step: "shipping", at: "2025-03-20T14:00:00+09:00", counterpartyId: "buyer-minato", inputs: [{ lot: bottle(s1, 200, 720, "9506000134352", "2025-03-18"), quantity: 200 }], referenceDoc: "INV-2025-031", place: "Kirinoha dispatch" });
}
