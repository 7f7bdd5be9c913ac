import "server-only";
import { and, asc, desc, eq, gte, inArray, lt, or, sql } from "drizzle-orm";
import { events, lots } from "@/db/schema";
import { KOJI_CHECKPOINTS, RICE_USES, type Band, type BandCheck, type KojiCheckpoint, type RiceUse } from "@/domain/brewing";
import { can } from "@/domain/permissions";
import { dayIn, nextDay, startOfDayIn } from "@/i18n/dates";
import { getDb } from "../platform/db";
import { forbidden, notFound } from "../platform/errors";
import { describeEvents, type LotEvent } from "../ledger/lot-events";
import type { SessionUser } from "../accounts/session";
import { breweryTimeZone } from "../platform/settings";

/** The steps of the brew floor that make a brew day, in the order the rice goes. */
export const BREW_DAY_STEPS = ["soaking", "steaming", "splitting", "koji-making", "starter", "mash-addition"] as const;
export type BrewDayStep = (typeof BREW_DAY_STEPS)[number];


/** A real calendar date written YYYY-MM-DD (2026-02-30 is not one). */
export function isCalendarDate(date: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return false;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return d.toISOString().slice(0, 10) === date;
}

/** The instants [start, end) of a calendar day on the brewery's clock (its time zone setting). */
export function brewDayRange(date: string, zone = breweryTimeZone()): { start: Date; end: Date } {
  return { start: startOfDayIn(date, zone), end: startOfDayIn(nextDay(date), zone) };
}

const notCorrected = sql`not exists (select 1 from events c where c.corrects = ${events.id})`;
const isKojiCheck = and(eq(events.step, "measuring"), sql`json_extract(${events.attributes}, '$.kojiChecks') is not null`);
const onTheFloor = or(inArray(events.step, [...BREW_DAY_STEPS]), isKojiCheck);

function requireRecords(actor: SessionUser) {
  if (!can(actor, "records:read-all")) throw forbidden();
}

export type BrewDayListing = { date: string; counts: Record<BrewDayStep, number>; kojiChecks: number; total: number };

/** Days with brew-floor events (corrected ones left out), newest first, with counts per step. */
export function listBrewDays(actor: SessionUser): BrewDayListing[] {
  requireRecords(actor);
  // Grouped here, not in SQL: a zone with daylight saving has no one offset to add there.
  const zone = breweryTimeZone();
  const rows = getDb()
    .select({ at: events.at, step: events.step })
    .from(events)
    .where(and(onTheFloor, notCorrected))
    .orderBy(desc(events.at))
    .all()
    .map((r) => ({ day: dayIn(r.at, zone), step: r.step, n: 1 }));
  const byDay = new Map<string, BrewDayListing>();
  for (const r of rows) {
    const entry = byDay.get(r.day) ?? { date: r.day, counts: Object.fromEntries(BREW_DAY_STEPS.map((s) => [s, 0])) as Record<BrewDayStep, number>, kojiChecks: 0, total: 0 };
    if (r.step === "measuring") entry.kojiChecks += r.n;
    else entry.counts[r.step as BrewDayStep] += r.n;
    entry.total += r.n;
    byDay.set(r.day, entry);
  }
  return [...byDay.values()];
}

type Marked = { eventId: number; at: string; corrected: boolean; correctionReason: string | null };
type Judged = { band: Band | null; bandCheck: BandCheck | null };
export type SoakRow = Marked & Judged & { lot: string; made: string; use: RiceUse | null; dryKg: number; drainedKg: number; absorptionPct: number; soakMinutes: number | null; waterTempC: number | null };
export type SteamRow = Marked & Judged & { lots: string[]; made: string; use: RiceUse | null; dryKg: number; steamedKg: number; gainPct: number; steamMinutes: number | null };
export type SplitRow = Marked & { lot: string; kg: number; portions: { lot: string; use: RiceUse; kg: number; tank: string | null; addition: string | null }[] };
export type LaterRow = Marked & { step: "koji-making" | "starter" | "mash-addition"; inputs: { lot: string; quantity: number; unit: string }[]; outputs: { lot: string; quantity: number; unit: string }[] };
export type KojiCheckRow = Marked & Judged & { lot: string; checkpoint: KojiCheckpoint; value: number };
export type DrawnRow = { lot: string; variety: string | null; polishingRatioPct: number | null; kg: number; uses: RiceUse[] };

const num = (v: unknown) => (typeof v === "number" ? v : null);
const measured = (e: LotEvent, name: string) => e.measurements.find((m) => m.name === name)?.value ?? null;

/**
 * Everything drawn, soaked, steamed, split and carried on to koji, starter and mash on one
 * Asia/Tokyo day, with the figures and band judgements recorded on each event. Corrected
 * events stay in the tables, marked, and are left out of the drawn totals and the charts.
 */
export function brewDaySummary(actor: SessionUser, date: string) {
  requireRecords(actor);
  if (!isCalendarDate(date)) throw notFound({ key: "errors.brewDayNotFound", values: { date } });
  const { start, end } = brewDayRange(date);
  const db = getDb();
  const ids = db
    .select({ id: events.id })
    .from(events)
    .where(and(onTheFloor, gte(events.at, start), lt(events.at, end)))
    .orderBy(asc(events.at), asc(events.id))
    .all()
    .map((r) => r.id);
  const list = describeEvents(ids);
  const correctionIds = list.flatMap((e) => (e.correctedBy ? [e.correctedBy] : []));
  const reasons = new Map(correctionIds.length ? db.select({ id: events.id, reason: events.reason }).from(events).where(inArray(events.id, correctionIds)).all().map((r) => [r.id, r.reason]) : []);
  const mark = (e: LotEvent): Marked => ({ eventId: e.id, at: e.at, corrected: e.correctedBy !== null, correctionReason: e.correctedBy ? (reasons.get(e.correctedBy) ?? "") : null });
  const judged = (a: Record<string, unknown>): Judged => ({ band: (a.band as Band | null) ?? null, bandCheck: (a.bandCheck as BandCheck | null) ?? null });
  const of = (step: string) => list.filter((e) => e.step === step);

  const soaks: SoakRow[] = of("soaking").map((e) => {
    const a = e.attributes;
    return { ...mark(e), ...judged(a), lot: e.inputs[0]?.lot ?? "", made: e.outputs[0]?.lot ?? "", use: (a.use as RiceUse | null) ?? null, dryKg: Number(a.dryKg), drainedKg: Number(a.drainedKg), absorptionPct: Number(a.absorptionPct), soakMinutes: measured(e, "soakMinutes"), waterTempC: measured(e, "waterTempC") };
  });
  const steams: SteamRow[] = of("steaming").map((e) => {
    const a = e.attributes;
    return { ...mark(e), ...judged(a), lots: e.inputs.map((i) => i.lot), made: e.outputs[0]?.lot ?? "", use: (a.use as RiceUse | null) ?? null, dryKg: Number(a.dryKg), steamedKg: Number(a.steamedKg), gainPct: Number(a.gainPct), steamMinutes: measured(e, "steamMinutes") };
  });
  const splits: SplitRow[] = of("splitting").map((e) => {
    const portions = (e.attributes.portions as { use: RiceUse; kg: number; tank: string | null; addition: string | null }[] | undefined) ?? [];
    // Outputs are written in the order of the portions (events.ts writes them one by one).
    return { ...mark(e), lot: e.inputs[0]?.lot ?? "", kg: e.inputs.reduce((s, i) => s + i.quantity, 0), portions: portions.map((p, n) => ({ ...p, lot: e.outputs[n]?.lot ?? "" })) };
  });
  const later: LaterRow[] = list
    .filter((e) => e.step === "koji-making" || e.step === "starter" || e.step === "mash-addition")
    .map((e) => ({ ...mark(e), step: e.step as LaterRow["step"], inputs: e.inputs.map(({ lot, quantity, unit }) => ({ lot, quantity, unit })), outputs: e.outputs.map(({ lot, quantity, unit }) => ({ lot, quantity, unit })) }));
  const kojiChecks: KojiCheckRow[] = of("measuring").flatMap((e) =>
    ((e.attributes.kojiChecks as { checkpoint: KojiCheckpoint; value: number; band: Band; bandCheck: BandCheck }[] | undefined) ?? [])
      .filter((c) => KOJI_CHECKPOINTS.includes(c.checkpoint))
      .map((c) => ({ ...mark(e), lot: e.inputs[0]?.lot ?? "", checkpoint: c.checkpoint, value: c.value, band: c.band ?? null, bandCheck: c.bandCheck ?? null })),
  );
  return { date, soaks, steams, splits, later, kojiChecks, drawn: drawnFrom(soaks) };
}
export type BrewDaySummary = ReturnType<typeof brewDaySummary>;

/** Polished rice drawn for the day's soaks that stand, per lot, with what the lot is. */
function drawnFrom(soaks: SoakRow[]): DrawnRow[] {
  const standing = soaks.filter((s) => !s.corrected);
  const codes = [...new Set(standing.map((s) => s.lot))];
  if (!codes.length) return [];
  const info = new Map(
    getDb()
      .select({ code: lots.code, variety: lots.variety, polishingRatioPct: lots.polishingRatioPct })
      .from(lots)
      .where(inArray(lots.code, codes))
      .all()
      .map((l) => [l.code, l]),
  );
  return codes.map((code) => {
    const mine = standing.filter((s) => s.lot === code);
    return {
      lot: code,
      variety: info.get(code)?.variety ?? null,
      polishingRatioPct: num(info.get(code)?.polishingRatioPct),
      kg: mine.reduce((a, s) => a + s.dryKg, 0),
      uses: RICE_USES.filter((u) => mine.some((s) => s.use === u)),
    };
  });
}

/** The brew days just before and after a date (it need not be one itself), for paging. */
export function neighbourBrewDays(actor: SessionUser, date: string): { previous: string | null; next: string | null } {
  const days = listBrewDays(actor).map((d) => d.date);
  return { previous: days.find((d) => d < date) ?? null, next: [...days].reverse().find((d) => d > date) ?? null };
}
