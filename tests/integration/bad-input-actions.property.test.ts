// Property-based bad input (fast-check) against every server action that takes a form: each starts
// from a form the action accepts, then one to three fields are replaced by hostile text (injection
// strings, numbers JavaScript reads oddly, overlong and unusual unicode, impossible dates, unknown
// codes), dropped, or joined by a field nobody asked for. The action must answer with a form state,
// never an internal error; and when it refuses, every table is exactly as it was.
// Sign-out takes no input; the authorisation matrix runs it.
import { desc } from "drizzle-orm";
import fc from "fast-check";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { outbox } from "@/db/schema";
import { translator } from "@/i18n/messages";
import { getDb, getSqlite } from "@/server/platform/db";
import { SETTING_DEFAULTS } from "@/server/platform/settings";
import { gtinCheckDigit } from "@/domain/gtin";
import { POST as eventsRoute } from "../../app/api/events/route";
import { POST as harvestsRoute } from "../../app/api/harvests/route";
import { POST as paymentsRoute } from "../../app/api/suppliers/[partyId]/payments/route";
import { POST as usersRoute } from "../../app/api/users/route";
import { ACTIONS, actionKey } from "../authz/matrix";
import { submit, type Action } from "../support/action-scope";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";
import { INJECTIONS } from "../support/bad-input";
import { HARVESTS } from "../support/bad-input-cases";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

/** Fixed, so that a failure reproduces (FUZZ_SEED / FUZZ_RUNS for a longer hunt, as in bad-input.property.test.ts). */
const SEED = Number(process.env.FUZZ_SEED ?? 20_261_202);
const RUNS = Number(process.env.FUZZ_RUNS ?? 60);
const INTERNAL = translator("en")("errors.internal");

type Who = "anonymous" | "admin" | "grower" | "miller";
const cookies: Record<Who, string> = { anonymous: "", admin: "", grower: "", miller: "" };
const prepared = { growerLot: "", eventId: "", token: "", paymentId: "", dispatchLot: "", confirmId: "", declineId: "", bottled: "", heldLot: "", holdLot: "" };

/** The settings form as the page fills it: every band's two bounds and the public-page boxes. */
function settingsForm(): Record<string, string> {
  const form: Record<string, string> = { polishingMarginPts: String(SETTING_DEFAULTS.polishingMarginPts), timeZone: SETTING_DEFAULTS.timeZone };
  for (const group of ["absorptionBands", "steamGainBands", "kojiBands"] as const) {
    for (const [key, band] of Object.entries(SETTING_DEFAULTS[group] as Record<string, { min: number; max: number }>)) {
      form[`${group}.${key}.min`] = String(band.min);
      form[`${group}.${key}.max`] = String(band.max);
    }
  }
  for (const [key, on] of Object.entries(SETTING_DEFAULTS.publicProvenance)) if (on) form[`publicProvenance.${key}`] = "on";
  return form;
}

/** GTIN-13s 9500000000001… with their check digits (GS1 General Specifications §7.9), one per call. */
let probeGtins = 0;
function nextProbeGtin(): string {
  const body = `950${String(++probeGtins).padStart(9, "0")}`;
  return body + gtinCheckDigit(body);
}

/** `mayChange`: tables a refusal may still write (a failed sign-in is counted, to throttle the next). */
type Case = { file: string; name: string; who: Who; base: () => Record<string, string>; mayChange?: string[] };
const CASES: Case[] = [
  // Signed in, so that the stored setting is what the corruptions meet (a visitor's choice stores nothing).
  { file: "app/(auth)/language/actions.ts", name: "setLanguageAction", who: "grower", base: () => ({ locale: "en" }) },
  { file: "app/(auth)/sign-in/actions.ts", name: "signInAction", who: "anonymous", base: () => ({ email: "grower2@example.com", password: "grainline-demo" }), mayChange: ["sign_in_throttle"] },
  { file: "app/(auth)/forgot-password/actions.ts", name: "forgotPasswordAction", who: "anonymous", base: () => ({ email: "nobody@example.org" }), mayChange: ["sign_in_throttle"] },
  { file: "app/(auth)/set-password/[token]/actions.ts", name: "setPasswordAction", who: "anonymous", base: () => ({ token: prepared.token, password: "a long probe password", confirm: "a long probe password" }), mayChange: ["sign_in_throttle"] },
  { file: "app/(office)/admin/parties/actions.ts", name: "createPartyAction", who: "admin", base: () => ({ kind: "grower", name: "Probe Farm", address: "1 Probe Lane", region: "Hyogo", email: "", phone: "", namedPublicly: "" }) },
  { file: "app/(office)/admin/parties/actions.ts", name: "updatePartyAction", who: "admin", base: () => ({ id: "grower-coop", kind: "grower", name: "Upper Asagiri Growers' Cooperative", address: "Asagiri Valley", region: "Okayama", email: "", phone: "", namedPublicly: "on" }) },
  { file: "app/(office)/admin/settings/actions.ts", name: "saveSettingsAction", who: "admin", base: settingsForm },
  { file: "app/(office)/admin/settings/actions.ts", name: "restoreDefaultsAction", who: "admin", base: () => ({}) },
  // A corrupted form that still reads right adds another tank or variety; the rest are refused.
  { file: "app/(office)/admin/settings/actions.ts", name: "saveTankAction", who: "admin", base: () => ({ id: "", name: "Probe Tank", capacityL: "1500", location: "Annex", active: "on" }) },
  { file: "app/(office)/admin/settings/actions.ts", name: "addVarietyAction", who: "admin", base: () => ({ name: "Probe Variety", kind: "table" }) },
  // Once the base form has taken Hitomebore off the list, a corruption that still reads right is refused as not listed.
  { file: "app/(office)/admin/settings/actions.ts", name: "removeVarietyAction", who: "admin", base: () => ({ name: "Hitomebore" }) },
  // A fresh GTIN each run (a registered one is refused as taken): GS1 prefix 950 is GS1's own example range.
  { file: "app/(office)/admin/products/actions.ts", name: "createProductAction", who: "admin", base: () => ({ name: "Probe Junmai", category: "junmai", bottleMl: "720", gtin: nextProbeGtin() }) },
  { file: "app/(office)/admin/users/actions.ts", name: "inviteUserAction", who: "admin", base: () => ({ name: "Probe Invitee", email: "probe.action@example.org", role: "grower", partyId: "grower-coop" }) },
  // The demo sales user: no other case here signs in as sales.
  { file: "app/(office)/admin/users/actions.ts", name: "deactivateUserAction", who: "admin", base: () => ({ userId: "user-sales" }) },
  { file: "app/(office)/admin/users/actions.ts", name: "reactivateUserAction", who: "admin", base: () => ({ userId: "user-sales" }) },
  { file: "app/(office)/admin/users/actions.ts", name: "changeRoleAction", who: "admin", base: () => ({ userId: "user-sales", role: "brewer" }) },
  { file: "app/(office)/fields/actions.ts", name: "createFieldAction", who: "grower", base: () => ({ name: "Probe Paddy", region: "Hyogo", areaHa: "1.5", latitude: "", longitude: "", growerId: "" }) },
  { file: "app/(office)/fields/actions.ts", name: "registerHarvestAction", who: "grower", base: () => ({ fieldId: "field-ikeda-terrace", variety: "Yamada Nishiki", cropYear: "2026", brownKg: "600", moisturePct: "14.8", grade: "1", bags: "10" }) },
  { file: "app/(office)/lots/[code]/actions.ts", name: "correctEventAction", who: "admin", base: () => ({ corrects: prepared.eventId, reason: "Probe: the reading was taken on the wrong lot" }) },
  { file: "app/(office)/lots/[code]/actions.ts", name: "shipToBuyerAction", who: "admin", base: () => ({ code: prepared.bottled, counterpartyId: "buyer-minato", date: "2026-11-27", quantity: "1", referenceDoc: "INV-PROBE-1" }) },
  // Once the base form has released the lot, a corruption that still reads right is refused as not on hold (409).
  { file: "app/(office)/lots/[code]/actions.ts", name: "releaseLotAction", who: "admin", base: () => ({ code: prepared.heldLot, reason: "Probe: cleared by the lab" }) },
  { file: "app/(office)/recall/actions.ts", name: "holdRecallAction", who: "admin", base: () => ({ code: prepared.holdLot, reason: "Probe: held for a check" }) },
  { file: "app/(office)/recall/actions.ts", name: "releaseRecallAction", who: "admin", base: () => ({ code: prepared.holdLot, reason: "Probe: check passed" }) },
  { file: "app/(office)/receive/actions.ts", name: "receiveLotAction", who: "miller", base: () => ({ code: prepared.growerLot, quantity: "598.5", referenceDoc: "DS-PROBE-1", place: "Mill yard", date: "2026-11-20", partyId: "" }) },
  { file: "app/(office)/dispatch/actions.ts", name: "dispatchLotAction", who: "grower", base: () => ({ code: prepared.dispatchLot, counterpartyId: "mill-shirotae", referenceDoc: "DS-PROBE-2", place: "", date: "2026-11-19" }) },
  { file: "app/(office)/dispatch/actions.ts", name: "confirmReceiptAction", who: "grower", base: () => ({ requestId: prepared.confirmId }) },
  { file: "app/(office)/dispatch/actions.ts", name: "declineReceiptAction", who: "grower", base: () => ({ requestId: prepared.declineId, reason: "Probe: not our delivery" }) },
  { file: "app/(office)/suppliers/actions.ts", name: "saveRoundingAction", who: "admin", base: () => ({ rounding: "half-up" }) },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "setInvoiceNumberAction", who: "admin", base: () => ({ partyId: "grower-nakase", invoiceNumber: "T1234567890123" }) },
  {
    file: "app/(office)/suppliers/[partyId]/actions.ts",
    name: "addGrowerContractAction",
    who: "admin",
    base: () => ({ partyId: "grower-ikeda", variety: "Omachi", cropYear: "2026", "price-tokujo": "30000", "price-tokuto": "29000", "price-1": "27000", "price-2": "25000", "price-3": "23000", "price-equivalent": "22000", "price-out-of-grade": "", moistureThresholdPct: "14.5", moistureStepPct: "0.1", moistureDeductionYen: "100", note: "" }),
  },
  {
    file: "app/(office)/suppliers/[partyId]/actions.ts",
    name: "addMillContractAction",
    who: "admin",
    base: () => ({ partyId: "mill-shirotae", "tier0-upTo": "50", "tier0-fee": "60", "tier1-upTo": "60", "tier1-fee": "45", "tier2-upTo": "70", "tier2-fee": "35", "tier3-upTo": "", "tier3-fee": "30", note: "" }),
  },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "recordPaymentAction", who: "admin", base: () => ({ partyId: "grower-ikeda", payDate: "2026-11-25", payAmount: "1000", payMethod: "bank-transfer", payReference: "", payOverReason: "" }) },
  // Once the base form has reversed the payment, a corruption that still reads right is refused as already reversed (409).
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "reversePaymentAction", who: "admin", base: () => ({ partyId: "grower-ikeda", entryId: prepared.paymentId, reversalReason: "Probe: paid twice" }) },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "recordAdjustmentAction", who: "admin", base: () => ({ partyId: "grower-ikeda", adjDate: "2026-11-25", adjAmount: "-500", adjRate: "8", adjReason: "Probe adjustment" }) },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "issueStatementAction", who: "admin", base: () => ({ partyId: "grower-nakase", from: "2025-01-01", to: "2025-01-31", email: "" }) },
];

/** Text a form field may carry that no form of ours would send. */
const hostile = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...INJECTIONS) },
  { weight: 3, arbitrary: fc.constantFrom("", " ", "\u3000", "NaN", "Infinity", "-Infinity", "1e999", "-1e999", "1e308", "-1", "-0", "0", "0x10", "1_000", "1,000", "３００", "12abc", ".", "-", "null", "undefined", "true", "[]", "{}", "[object Object]") },
  { weight: 2, arbitrary: fc.constantFrom("2026-02-30", "2026-13-01", "0000-00-00", "99999-01-01", "2026-11-25T25:00", "H26-9999", "ZZ99-0001", "no-such-party", "field-nakase-river", "brewery-kirinoha", "T123", "out-of-grade") },
  { weight: 2, arbitrary: fc.oneof(fc.double(), fc.integer(), fc.bigInt()).map(String) },
  { weight: 2, arbitrary: fc.string({ unit: "grapheme", maxLength: 30 }) },
  { weight: 1, arbitrary: fc.string({ unit: "binary", maxLength: 30 }) },
  { weight: 1, arbitrary: fc.tuple(fc.constantFrom("a", "🍶", "\u202E", "e\u0301", "'", "ー", "\u0000"), fc.integer({ min: 101, max: 3000 })).map(([unit, n]) => unit.repeat(n)) },
);

type Change = { field: string; to?: string };
/** One to three fields replaced or dropped, now and then a field the form does not have. */
function corruptions(base: Record<string, string>): fc.Arbitrary<{ form: [string, string][]; what: string }> {
  const fields = Object.keys(base);
  const change: fc.Arbitrary<Change> = fields.length
    ? fc.oneof({ weight: 5, arbitrary: fc.record({ field: fc.constantFrom(...fields), to: hostile }) }, { weight: 1, arbitrary: fc.record({ field: fc.constantFrom(...fields) }) })
    : fc.record({ field: fc.string({ minLength: 1, maxLength: 12 }), to: hostile });
  const extra = fc.option(fc.tuple(fc.string({ minLength: 1, maxLength: 16 }).filter((k) => !(k in base)), hostile), { nil: undefined, freq: 4 });
  return fc.tuple(fc.array(change, { minLength: 1, maxLength: 3 }), extra).map(([changes, more]) => {
    const form = { ...base };
    for (const { field, to } of changes) {
      if (to === undefined) delete form[field];
      else form[field] = to;
    }
    const entries = Object.entries(form);
    if (more) entries.push(more);
    const what = [...changes.map(({ field, to }) => (to === undefined ? `without ${field}` : `${field}=${JSON.stringify(to.slice(0, 60))}`)), ...(more ? [`+${JSON.stringify(more[0])}`] : [])].join(", ");
    return { form: entries, what };
  });
}

const load = (file: string) => import(/* @vite-ignore */ `../../${file}`) as Promise<Record<string, Action>>;

beforeAll(async () => {
  for (const who of ["admin", "grower", "miller"] as const) cookies[who] = await signInAs(`${who}@example.com`);
  // A harvest still at the farm, for the receipt; a reading the office may correct; an invitation's link.
  const harvest = await call(harvestsRoute, jsonRequest("/api/harvests", { cookie: cookies.grower, body: HARVESTS.base }));
  expect(harvest.status).toBe(201);
  prepared.growerLot = harvest.body.code;
  // Two more of the grower's harvests: one to dispatch, one the mill "receives" undispatched (twice: to confirm, to decline).
  const more = async () => (await call(harvestsRoute, jsonRequest("/api/harvests", { cookie: cookies.grower, body: HARVESTS.base }))).body.code as string;
  prepared.dispatchLot = await more();
  // Bottles to ship; a lot on hold to release; a lot to hold and release with its recall.
  prepared.bottled = (getSqlite().prepare("select code from lots where kind = 'bottled' and on_hand >= 100 order by id").get() as { code: string }).code;
  [prepared.heldLot, prepared.holdLot] = [await more(), await more()];
  const { holdRecallAction } = await load("app/(office)/recall/actions.ts");
  expect(await submit(cookies.admin, holdRecallAction!, { code: prepared.heldLot, reason: "Probe: held to be released" })).toMatchObject({ state: { ok: true } });
  for (const key of ["confirmId", "declineId"] as const) {
    const awaited = await more();
    const receipt = await call(eventsRoute, jsonRequest("/api/events", { cookie: cookies.miller, body: { step: "receiving", inputs: [{ lot: awaited, quantity: 1 }] } }));
    expect(receipt.status).toBe(202);
    prepared[key] = String((getSqlite().prepare("select max(id) as id from receipt_requests").get() as { id: number }).id);
  }
  const reading = await call(eventsRoute, jsonRequest("/api/events", { cookie: cookies.grower, body: { step: "measuring", inputs: [{ lot: harvest.body.code, quantity: 0 }], measurements: [{ name: "moisturePct", value: 14.9, unit: "%" }] } }));
  expect(reading.status).toBe(201);
  prepared.eventId = String(reading.body.id);
  const invited = await call(usersRoute, jsonRequest("/api/users", { cookie: cookies.admin, body: { name: "Probe Newcomer", email: "probe.newcomer@example.org", role: "brewer", partyId: "brewery-kirinoha" } }));
  expect(invited.status).toBe(201);
  const mail = getDb().select().from(outbox).orderBy(desc(outbox.createdAt)).get()!;
  prepared.token = /\/set-password\/([A-Za-z0-9_-]+)/.exec(mail.textBody)![1]!;
  // A payment for the reversal to undo.
  const paid = await call(paymentsRoute, jsonRequest("/api/suppliers/grower-ikeda/payments", { cookie: cookies.admin, body: { date: "2026-11-26", amountYen: 1_500, method: "cash", reference: "Probe" } }), { partyId: "grower-ikeda" });
  expect(paid.status, JSON.stringify(paid.body)).toBe(201);
  prepared.paymentId = String(paid.body.id);
});

describe("server actions under bad input: a form state, never an internal error; a refusal changes nothing", () => {
  it("covers every server action of the authorisation matrix (which lists all of app/) but sign-out", () => {
    const covered = CASES.map(actionKey);
    expect(ACTIONS.map(actionKey).filter((key) => !covered.includes(key))).toEqual(["app/(auth)/sign-out/actions.ts signOutAction"]);
  });

  for (const c of CASES) {
    it(`${c.name} (${c.file})`, async () => {
      const action = (await load(c.file))[c.name]!;
      // The base form gets past every check: the corruptions below meet the check meant for them.
      const accepted = await submit(cookies[c.who], action, c.base());
      expect("redirect" in accepted || accepted.state.ok, JSON.stringify(accepted)).toBe(true);

      await fc.assert(
        fc.asyncProperty(corruptions(c.base()), async ({ form, what }) => {
          const before = await tableDigests(c.mayChange);
          const answer = await submit(cookies[c.who], action, form);
          if ("redirect" in answer) return;
          expect(answer.state.message, what).not.toBe(INTERNAL);
          if (answer.state.ok) return;
          expect(typeof answer.state.message === "string" || Object.keys(answer.state.fields ?? {}).length > 0, what).toBe(true);
          expect(await tableDigests(c.mayChange), what).toEqual(before);
        }),
        { seed: SEED, numRuns: RUNS, endOnFailure: true },
      );
      // Still a working database afterwards.
      expect(getSqlite().pragma("integrity_check", { simple: true })).toBe("ok");
    });
  }
});
