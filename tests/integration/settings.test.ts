import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { DEFAULT_ABSORPTION_BANDS, KOJI_CHECKPOINTS, RICE_USES } from "@/domain/brewing";
import { translator } from "@/i18n/messages";
import { auditRecord, renderAudit, type AuditTranslate } from "@/server/records/audit-record";
import { settingsFromForm } from "@/lib/validation/settings";
import { getDb, getSqlite } from "@/server/platform/db";
import { DEMO_USERS } from "@/server/records/seed";
import type { SessionUser } from "@/server/accounts/session";
import { readSetting, readSettings, restoreSettingDefaults, saveSettings, SETTING_DEFAULTS } from "@/server/platform/settings";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

// Default bands are trade practice from memory (../shared/references.md): mash absorption 25–30 %.
// Absorption = (drained − dry) ÷ dry × 100 (Nada brewers' research association glossary, same file).
const en = translator("en");
const t = (key: string, values?: Record<string, string | number>) => en(key as never, values as never);
const actor = (id: string) => DEMO_USERS.find((u) => u.id === id)! as SessionUser;
let brewer: string;

/** The settings page's form, field by field, as the browser posts it. */
function formOf(settings: ReturnType<typeof readSettings>, changes: Record<string, string> = {}): Record<string, string> {
  const values: Record<string, string> = { polishingMarginPts: String(settings.polishingMarginPts), timeZone: settings.timeZone };
  for (const [group, keys] of [["absorptionBands", RICE_USES], ["steamGainBands", RICE_USES], ["kojiBands", KOJI_CHECKPOINTS]] as const) {
    for (const k of keys) {
      const band = (settings[group] as Record<string, { min: number; max: number }>)[k]!;
      values[`${group}.${k}.min`] = String(band.min);
      values[`${group}.${k}.max`] = String(band.max);
    }
  }
  // Ticked boxes send "on"; unticked ones send nothing.
  for (const [k, shown] of Object.entries(settings.publicProvenance)) if (shown) values[`publicProvenance.${k}`] = "on";
  return { ...values, ...changes };
}

async function soakMash(dryKg: number, drainedKg: number) {
  const res = await call(postEvent, jsonRequest("/api/events", { cookie: brewer, body: { step: "soaking", inputs: [{ lot: "P26-0003", quantity: dryKg }], outputs: [{ kind: "soaked", quantity: drainedKg, use: "mash" }], measurements: [{ name: "soakMinutes", value: 40, unit: "min" }, { name: "waterTempC", value: 12, unit: "°C" }] } }));
  expect(res.status).toBe(201);
  const row = getSqlite().prepare("select attributes from events where id = ?").get(res.body.id) as { attributes: string };
  return { warnings: res.body.warnings as string[], attributes: JSON.parse(row.attributes) };
}

const auditRows = () => getSqlite().prepare("select user_id as userId, action, subject, detail from audit_log where action = 'settings.updated' order by id").all() as { userId: string; action: string; subject: string; detail: string }[];

beforeAll(async () => {
  brewer = await signInAs("brewer@example.com");
});

describe("brewery settings", () => {
  it("start at the defaults", () => {
    expect(readSettings()).toEqual(SETTING_DEFAULTS);
    expect(readSetting(getDb(), "absorptionBands").mash).toEqual({ min: 25, max: 30 });
  });

  it("refuses a brewer with 403 and changes nothing", async () => {
    const before = await tableDigests();
    const form = settingsFromForm(formOf(readSettings(), { "absorptionBands.mash.min": "28", "absorptionBands.mash.max": "34" }));
    expect(() => saveSettings(actor("user-brewer"), form, t)).toThrow(expect.objectContaining({ status: 403 }));
    expect(() => restoreSettingDefaults(actor("user-brewer"))).toThrow(expect.objectContaining({ status: 403 }));
    expect(await tableDigests()).toEqual(before);
  });

  it("refuses invalid bands with 422 and field messages, and changes nothing", async () => {
    const before = await tableDigests();
    const form = formOf(readSettings(), {
      "absorptionBands.mash.min": "34", // above its upper edge
      "absorptionBands.mash.max": "28",
      "steamGainBands.koji.max": "120", // over 100 %
      "kojiBands.finish.max": "61", // koji room bands stop at 60 °C
      "kojiBands.bringingIn.min": "",
      polishingMarginPts: "11",
    });
    let error: { status: number; fields: Record<string, string[]> } | undefined;
    try {
      saveSettings(actor("user-admin"), settingsFromForm(form), t);
    } catch (e) {
      error = e as typeof error;
    }
    expect(error?.status).toBe(422);
    expect(error?.fields).toEqual({
      "absorptionBands.mash.max": ["The upper edge must be above the lower edge."],
      "steamGainBands.koji.max": [t("validation.tooBig", { maximum: 100 })],
      "kojiBands.bringingIn.min": ["This is required."],
      "kojiBands.finish.max": [t("validation.tooBig", { maximum: 60 })],
      polishingMarginPts: [t("validation.tooBig", { maximum: 10 })],
    });
    // Equal edges are no band either.
    expect(() => saveSettings(actor("user-admin"), settingsFromForm(formOf(readSettings(), { "kojiBands.mounding.min": "36", "kojiBands.mounding.max": "36" })), t)).toThrow(
      expect.objectContaining({ status: 422, fields: { "kojiBands.mounding.max": ["The upper edge must be above the lower edge."] } }),
    );
    expect(await tableDigests()).toEqual(before);
  });

  it("judges a later soak against the band the admin saved, and audits the change", async () => {
    // 132 kg drained from 100 kg: 32 %, above the default mash band 25–30 %.
    expect((await soakMash(100, 132)).attributes).toMatchObject({ absorptionPct: 32, band: { min: 25, max: 30 }, bandCheck: "above" });

    const result = saveSettings(actor("user-admin"), settingsFromForm(formOf(readSettings(), { "absorptionBands.mash.min": "28", "absorptionBands.mash.max": "34" })), t);
    expect(result.changed).toEqual(["absorptionBands"]);
    expect(readSetting(getDb(), "absorptionBands")).toEqual({ ...DEFAULT_ABSORPTION_BANDS, mash: { min: 28, max: 34 } });

    const after = await soakMash(100, 132);
    expect(after.attributes).toMatchObject({ absorptionPct: 32, band: { min: 28, max: 34 }, bandCheck: "within" });
    expect(after.warnings).toEqual([]);

    const audits = auditRows();
    expect(audits).toHaveLength(1);
    expect(audits[0]).toMatchObject({ userId: "user-admin", subject: "settings" });
    expect(JSON.parse(audits[0]!.detail)).toEqual({
      changed: ["absorptionBands"],
      before: { absorptionBands: DEFAULT_ABSORPTION_BANDS },
      after: { absorptionBands: { ...DEFAULT_ABSORPTION_BANDS, mash: { min: 28, max: 34 } } },
    });
    // Saving the same figures again writes and audits nothing.
    expect(saveSettings(actor("user-admin"), settingsFromForm(formOf(readSettings())), t).changed).toEqual([]);
    expect(auditRows()).toHaveLength(1);
  });

  it("restores the defaults, and later soaks are judged against them again", async () => {
    expect(restoreSettingDefaults(actor("user-admin")).changed).toEqual(["absorptionBands"]);
    expect(readSettings()).toEqual(SETTING_DEFAULTS);
    expect((await soakMash(100, 132)).attributes).toMatchObject({ band: { min: 25, max: 30 }, bandCheck: "above" });
    const audits = auditRows();
    expect(audits).toHaveLength(2);
    expect(JSON.parse(audits[1]!.detail)).toMatchObject({ restoredDefaults: true, changed: ["absorptionBands"], before: { absorptionBands: { mash: { min: 28, max: 34 } } } });
    expect(restoreSettingDefaults(actor("user-admin")).changed).toEqual([]);
  });
});

describe("the brewery's time zone", () => {
  it("refuses a zone the IANA list lacks with a field message, and saves nothing", async () => {
    const before = await tableDigests();
    for (const zone of ["Asia/Osaka", "JST", ""]) {
      expect(() => saveSettings(actor("user-admin"), settingsFromForm(formOf(readSettings(), { timeZone: zone })), t)).toThrow(
        expect.objectContaining({ status: 422, fields: { timeZone: ["Choose a time zone from the list (e.g. Asia/Tokyo)."] } }),
      );
    }
    expect(await tableDigests()).toEqual(before);
  });

  it("saves a zone of the list (Intl.supportedValuesOf, ECMA-402) and audits it; figures may be typed full width", () => {
    const saved = saveSettings(actor("user-admin"), settingsFromForm(formOf(readSettings(), { timeZone: "Europe/London", polishingMarginPts: "１.５" })), t);
    expect(saved.changed).toEqual(["polishingMarginPts", "timeZone"]);
    expect(readSetting(getDb(), "timeZone")).toBe("Europe/London");
    expect(JSON.parse(auditRows().at(-1)!.detail)).toMatchObject({ before: { timeZone: "Asia/Tokyo" }, after: { timeZone: "Europe/London" } });
    // The audit record words the change for people, in each language.
    for (const [locale, name] of [["en", "time zone: Asia/Tokyo → Europe/London"], ["ja", "タイムゾーン: Asia/Tokyo → Europe/London"]] as const) {
      const [line] = renderAudit(auditRecord(5), translator(locale) as unknown as AuditTranslate, locale);
      expect(line!.summary).toContain(name);
    }
    restoreSettingDefaults(actor("user-admin"));
    expect(readSetting(getDb(), "timeZone")).toBe("Asia/Tokyo");
  });
});
