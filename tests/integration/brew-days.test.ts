import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { DEMO_USERS } from "@/server/records/seed";
import { brewDayRange, brewDaySummary, listBrewDays, neighbourBrewDays } from "@/server/floor/brew-days";
import { getDb, getSqlite } from "@/server/platform/db";
import type { SessionUser } from "@/server/accounts/session";
import { writeSetting } from "@/server/platform/settings";
import { call, jsonRequest, signInAs } from "../support/api";

// Absorption and steaming gain on the dry basis: Nada brewers' research association glossary,
// via ../shared/references.md. The bands are the trade-practice defaults (from memory, same file):
// absorption koji 30–35 %, starter 28–33 %, mash 25–30 %; gain koji 35–42 %, mash 33–40 %;
// koji bringing-in 33–36 °C. Japan time is UTC+9 all year (no daylight saving).
let brewer: string;
const actor = (id: string) => DEMO_USERS.find((u) => u.id === id)! as SessionUser;
const event = async (body: unknown) => {
  const res = await call(postEvent, jsonRequest("/api/events", { cookie: brewer, body }));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: number; outputs: { code: string }[] };
};
const m = (name: string, value: number, unit: string) => ({ name, value, unit });
const soak = (at: string, lot: string, dryKg: number, drainedKg: number, use: string) =>
  event({ step: "soaking", at, inputs: [{ lot, quantity: dryKg }], outputs: [{ kind: "soaked", quantity: drainedKg, use }], measurements: [m("soakMinutes", 15, "min"), m("waterTempC", 11.5, "°C")] });

const ids: Record<string, number> = {};
beforeAll(async () => {
  brewer = await signInAs("brewer@example.com");
  // 00:10 in Tokyo on 1 December is still 30 November in UTC: grouping by UTC would misplace it.
  const wrong = await soak("2026-12-01T00:10:00+09:00", "P26-0002", 100, 127, "mash");
  ids.wrong = wrong.id;
  const koji = await soak("2026-12-01T08:00:00+09:00", "P26-0001", 100, 132, "koji");
  const mash = await soak("2026-12-01T09:00:00+09:00", "P26-0003", 100, 140, "mash");
  await soak("2026-12-01T23:30:00+09:00", "P26-0005", 50, 62, "starter");
  // 07:30 on 2 December in Tokyo is 22:30 on 1 December in UTC.
  await soak("2026-12-02T07:30:00+09:00", "P26-0001", 100, 130, "koji");
  await event({ step: "correcting", corrects: wrong.id, reason: "Drained weight read off the wrong tub" });

  const steamedKoji = await event({ step: "steaming", at: "2026-12-01T10:00:00+09:00", inputs: [{ lot: koji.outputs[0]!.code, quantity: 132 }], outputs: [{ kind: "steamed", quantity: 141 }], measurements: [m("steamMinutes", 50, "min")] });
  const steamedMash = await event({ step: "steaming", at: "2026-12-01T11:00:00+09:00", inputs: [{ lot: mash.outputs[0]!.code, quantity: 140 }], outputs: [{ kind: "steamed", quantity: 130 }], measurements: [m("steamMinutes", 55, "min")] });
  await event({ step: "splitting", at: "2026-12-01T11:30:00+09:00", inputs: [{ lot: steamedMash.outputs[0]!.code, quantity: 130 }], outputs: [{ kind: "steamed", quantity: 50, use: "mash", addition: "first" }, { kind: "steamed", quantity: 80, use: "mash", addition: "middle" }] });
  await event({ step: "measuring", at: "2026-12-01T12:00:00+09:00", inputs: [{ lot: steamedKoji.outputs[0]!.code, quantity: 0 }], measurements: [m("kojiTempBringingIn", 37, "°C")] });
});

describe("a brew day's summary", () => {
  it("lists each soak with its absorption and band judgement, the corrected one marked", () => {
    const day = brewDaySummary(actor("user-brewer"), "2026-12-01");
    expect(day.soaks.map((s) => [s.lot, s.use, s.absorptionPct, s.band, s.bandCheck, s.corrected])).toEqual([
      ["P26-0002", "mash", 27, { min: 25, max: 30 }, "within", true], // (127 − 100) ÷ 100, later corrected
      ["P26-0001", "koji", 32, { min: 30, max: 35 }, "within", false], // (132 − 100) ÷ 100
      ["P26-0003", "mash", 40, { min: 25, max: 30 }, "above", false], // (140 − 100) ÷ 100
      ["P26-0005", "starter", 24, { min: 28, max: 33 }, "below", false], // (62 − 50) ÷ 50
    ]);
    expect(day.soaks[0]!.correctionReason).toBe("Drained weight read off the wrong tub");
    expect(day.soaks[1]).toMatchObject({ dryKg: 100, drainedKg: 132, soakMinutes: 15, waterTempC: 11.5, made: expect.stringMatching(/^SK26-\d{4}$/) });
  });

  it("counts only standing soaks in the rice drawn", () => {
    const day = brewDaySummary(actor("user-brewer"), "2026-12-01");
    expect(day.drawn.map((d) => [d.lot, d.kg, d.uses])).toEqual([
      ["P26-0001", 100, ["koji"]],
      ["P26-0003", 100, ["mash"]],
      ["P26-0005", 50, ["starter"]],
    ]);
    // P26-0001 is the 50 % run of the seeded season (1,500 kg from 3,000 kg brown).
    expect(day.drawn[0]).toMatchObject({ variety: "Yamada Nishiki", polishingRatioPct: 50 });
  });

  it("carries steaming gain, the split portions and koji readings with their bands", () => {
    const day = brewDaySummary(actor("user-sales"), "2026-12-01");
    // Koji: (141 − 100) ÷ 100 = 41 % in 35–42; mash: (130 − 100) ÷ 100 = 30 % under 33–40.
    expect(day.steams.map((s) => [s.use, s.dryKg, s.steamedKg, s.gainPct, s.bandCheck])).toEqual([
      ["koji", 100, 141, 41, "within"],
      ["mash", 100, 130, 30, "below"],
    ]);
    expect(day.splits).toHaveLength(1);
    expect(day.splits[0]!.kg).toBe(130);
    expect(day.splits[0]!.portions.map((p) => [p.use, p.addition, p.kg])).toEqual([["mash", "first", 50], ["mash", "middle", 80]]);
    expect(day.splits[0]!.portions.every((p) => /^ST26-\d{4}$/.test(p.lot))).toBe(true);
    expect(day.kojiChecks.map((c) => [c.checkpoint, c.value, c.band, c.bandCheck])).toEqual([["bringingIn", 37, { min: 33, max: 36 }, "above"]]);
  });

  it("groups days by the calendar in Asia/Tokyo", () => {
    // IANA tz database: Asia/Tokyo is UTC+9 all year.
    expect(brewDayRange("2026-12-01")).toEqual({ start: new Date("2026-11-30T15:00:00Z"), end: new Date("2026-12-01T15:00:00Z") });
    const next = brewDaySummary(actor("user-brewer"), "2026-12-02");
    expect(next.soaks.map((s) => [s.lot, s.absorptionPct, s.bandCheck])).toEqual([["P26-0001", 30, "within"]]); // on the band's lower edge
    expect(brewDaySummary(actor("user-brewer"), "2026-11-30").soaks).toEqual([]);

    // The demo seed brews an earlier season too; this season's days are the two recorded here.
    const all = listBrewDays(actor("user-auditor"));
    const days = all.filter((d) => d.date >= "2026-11-01");
    expect(days.map((d) => d.date)).toEqual(["2026-12-02", "2026-12-01"]);
    expect(all.map((d) => d.date)).toEqual([...all.map((d) => d.date)].sort().reverse()); // newest first
    expect(days[1]).toMatchObject({ counts: { soaking: 3, steaming: 2, splitting: 1, "koji-making": 0, starter: 0, "mash-addition": 0 }, kojiChecks: 1, total: 7 });
    expect(days[0]).toMatchObject({ counts: { soaking: 1 }, total: 1 });
    const around = neighbourBrewDays(actor("user-brewer"), "2026-12-01");
    expect(around.next).toBe("2026-12-02");
    expect(around.previous === null || around.previous < "2026-11-01").toBe(true);
  });

  it("follows the brewery's clock when it keeps another zone", () => {
    // IANA tz database: Europe/London is UTC+0 in December. 07:30 on 2 December in Tokyo is
    // 22:30 on 1 December in London, so that soak joins the 1st.
    writeSetting(getDb(), "timeZone", "Europe/London", "user-admin");
    try {
      expect(brewDaySummary(actor("user-brewer"), "2026-12-02").soaks).toEqual([]);
      expect(brewDaySummary(actor("user-brewer"), "2026-12-01").soaks.map((s) => s.lot)).toContain("P26-0001");
      expect(listBrewDays(actor("user-auditor")).map((d) => d.date)).not.toContain("2026-12-02");
    } finally {
      getSqlite().prepare("delete from settings where key = 'timeZone'").run();
    }
  });

  it("refuses dates that are not calendar days with 404, and roles without records:read-all with 403", () => {
    for (const date of ["2026-02-30", "2026-12-1", "yesterday", "2026-13-01"]) {
      expect(() => brewDaySummary(actor("user-brewer"), date), date).toThrow(expect.objectContaining({ status: 404 }));
    }
    expect(() => brewDaySummary(actor("user-grower"), "2026-12-01")).toThrow(expect.objectContaining({ status: 403 }));
    expect(() => listBrewDays(actor("user-miller"))).toThrow(expect.objectContaining({ status: 403 }));
  });
});
