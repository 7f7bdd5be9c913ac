import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { GET as getLotRoute } from "../../app/api/lots/[code]/route";
import { getSqlite } from "@/server/platform/db";
import { tankSummary } from "@/server/floor/tanks";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

// One tank's whole path through the API, with figures worked by hand on the dry basis
// (definitions: Nada brewers' research association glossary, via ../shared/references.md).
let brewer: string;
const event = (body: unknown, headers: Record<string, string> = {}) => call(postEvent, jsonRequest("/api/events", { cookie: brewer, body, headers }));
const lot = async (code: string) => (await call(getLotRoute, jsonRequest(`/api/lots/${code}`, { cookie: brewer }), { code })).body;
const out = (res: { body: { outputs: { code: string }[] } }, n = 0) => res.body.outputs[n]!.code;
const m = (name: string, value: number, unit: string) => ({ name, value, unit });

describe("from polished rice to bottles", () => {
  const codes: Record<string, string> = {};
  beforeAll(async () => {
    brewer = await signInAs("brewer@example.com");
  });

  it("soaks: absorption within and outside the use's band (trade-practice defaults)", async () => {
    const koji = await event({ step: "soaking", inputs: [{ lot: "P26-0001", quantity: 200 }], outputs: [{ kind: "soaked", quantity: 264, use: "koji" }], measurements: [m("soakMinutes", 12, "min"), m("waterTempC", 11, "°C")] });
    expect(koji.status).toBe(201);
    expect(koji.body.warnings).toEqual([]);
    codes.soakedKoji = out(koji);
    const mash = await event({ step: "soaking", inputs: [{ lot: "P26-0003", quantity: 800 }], outputs: [{ kind: "soaked", quantity: 1040, use: "mash" }], measurements: [m("soakMinutes", 60, "min"), m("waterTempC", 12, "°C")] });
    expect(mash.body.warnings).toEqual([]); // 30 % sits on the mash band's upper edge
    codes.soakedMash = out(mash);
    const wet = await event({ step: "soaking", inputs: [{ lot: "P26-0003", quantity: 100 }], outputs: [{ kind: "soaked", quantity: 140, use: "mash" }], measurements: [m("soakMinutes", 90, "min"), m("waterTempC", 12, "°C")] });
    expect(wet.status).toBe(201);
    expect(wet.body.warnings).toEqual(["Water absorption 40 % is outside the target band 25–30 %."]);
  });

  it("refuses a soak without its measurements, changing nothing", async () => {
    const before = await tableDigests();
    const res = await event({ step: "soaking", inputs: [{ lot: "P26-0003", quantity: 10 }], outputs: [{ kind: "soaked", quantity: 13, use: "kake" }], measurements: [] });
    expect(res.status).toBe(422);
    // The use may be left out (decided at the split), but a use that is named must be one of the trade's.
    expect(Object.keys(res.body.error.fields).sort()).toEqual(["measurements.soakMinutes", "measurements.waterTempC", "outputs.0.use"]);
    expect(await tableDigests()).toEqual(before);
  });

  it("steams on the dry basis and carries the use on", async () => {
    const koji = await event({ step: "steaming", inputs: [{ lot: codes.soakedKoji, quantity: 264 }], outputs: [{ kind: "steamed", quantity: 280 }], measurements: [m("steamMinutes", 50, "min")] });
    expect(koji.status).toBe(201);
    codes.steamedKoji = out(koji);
    expect((await lot(codes.steamedKoji)).attributes.use).toBe("koji");
    const mash = await event({ step: "steaming", inputs: [{ lot: codes.soakedMash, quantity: 1040 }], outputs: [{ kind: "steamed", quantity: 1100 }], measurements: [m("steamMinutes", 55, "min")] });
    codes.steamedMash = out(mash);
    // (1100 − 800) ÷ 800 = 37.5 %
    const row = getSqlite().prepare("select attributes from events where id = ?").get(mash.body.id) as { attributes: string };
    expect(JSON.parse(row.attributes)).toMatchObject({ dryKg: 800, gainPct: 37.5, bandCheck: "within" });
  });

  it("splits the steamed rice into portions that add up", async () => {
    const bad = await event({ step: "splitting", inputs: [{ lot: codes.steamedMash, quantity: 1100 }], outputs: [{ kind: "steamed", quantity: 1000, use: "mash", addition: "first" }] });
    expect(bad.status).toBe(422);
    const res = await event({
      step: "splitting",
      inputs: [{ lot: codes.steamedMash, quantity: 1100 }],
      outputs: [
        { kind: "steamed", quantity: 100, use: "starter" },
        { kind: "steamed", quantity: 200, use: "mash", addition: "first" },
        { kind: "steamed", quantity: 300, use: "mash", addition: "middle" },
        { kind: "steamed", quantity: 500, use: "mash", addition: "final" },
      ],
    });
    expect(res.status).toBe(201);
    [codes.forStarter, codes.first, codes.middle, codes.final] = res.body.outputs.map((o: { code: string }) => o.code);
  });

  it("logs koji checkpoints against their bands and makes koji", async () => {
    const ok = await event({ step: "measuring", inputs: [{ lot: codes.steamedKoji, quantity: 0 }], measurements: [m("kojiTempBringingIn", 34, "°C")] });
    expect(ok.body.warnings).toEqual([]);
    const hot = await event({ step: "measuring", inputs: [{ lot: codes.steamedKoji, quantity: 0 }], measurements: [m("kojiTempRebreaking", 35.5, "°C")] });
    expect(hot.body.warnings).toEqual(["Koji temperature at re-breaking 35.5 °C is outside the band 30–34 °C."]);
    const koji = await event({ step: "koji-making", inputs: [{ lot: codes.steamedKoji, quantity: 280 }], outputs: [{ kind: "koji", quantity: 240 }], measurements: [m("sporeG", 80, "g")], attributes: { startedAt: "2026-12-01T09:00:00+09:00" } });
    expect(koji.status).toBe(201);
    codes.koji = out(koji);
  });

  it("builds a starter and a tank in three additions; koji ratio on the dry basis", async () => {
    const starter = await event({ step: "starter", inputs: [{ lot: codes.koji, quantity: 40 }, { lot: codes.forStarter, quantity: 100 }], outputs: [{ kind: "starter", quantity: 260 }], measurements: [m("waterL", 120, "L")] });
    expect(starter.status).toBe(201);
    codes.starter = out(starter);
    const first = await event({ step: "mash-addition", attributes: { addition: "first" }, inputs: [{ lot: codes.starter, quantity: 260 }, { lot: codes.koji, quantity: 50 }, { lot: codes.first, quantity: 200 }], outputs: [{ kind: "tank", quantity: 760, tankName: "Tank 3" }], measurements: [m("waterL", 250, "L")] });
    expect(first.status).toBe(201);
    codes.tank = out(first);
    const misplaced = await event({ step: "mash-addition", attributes: { addition: "middle" }, inputs: [{ lot: codes.koji, quantity: 60 }], outputs: [{ kind: "tank", quantity: 60 }], measurements: [m("waterL", 0, "L")] });
    expect(misplaced.status).toBe(422);
    await event({ step: "mash-addition", attributes: { addition: "middle" }, inputs: [{ lot: codes.koji, quantity: 60 }, { lot: codes.middle, quantity: 300 }], outputs: [{ lot: codes.tank, quantity: 760 }], measurements: [m("waterL", 400, "L")] });
    const final = await event({ step: "mash-addition", attributes: { addition: "final" }, inputs: [{ lot: codes.koji, quantity: 90 }, { lot: codes.final, quantity: 500 }], outputs: [{ lot: codes.tank, quantity: 1290 }], measurements: [m("waterL", 700, "L")] });
    expect(final.status).toBe(201);

    const summary = tankSummary({ id: "user-brewer", role: "brewer", partyId: "brewery-kirinoha", email: "", name: "" }, codes.tank!);
    // Rice: 200 kg koji rice + 800 kg steamed rice, all of it in this tank.
    expect(summary.totalRiceKg).toBeCloseTo(1000, 9);
    // Koji rice 200 kg of 1,000 kg on the dry basis (by weight of koji it would be 240 of 1,040).
    expect(summary.kojiRiceKg).toBeCloseTo(200, 9);
    expect(summary.kojiRatioPct).toBe(20);
    // Water 120 + 250 + 400 + 700 = 1,470 L over 1,000 kg rice.
    expect(summary.waterL).toBeCloseTo(1470, 9);
    expect(summary.waterRatioPct).toBe(147);
    expect(summary.additions.map((a) => a.addition)).toEqual(["first", "middle", "final"]);
    expect(summary.onHandKg).toBe(2810);
  });

  it("presses, refuses a wrong GTIN and a volume mismatch, and bottles", async () => {
    const press = await event({ step: "pressing", inputs: [{ lot: codes.tank, quantity: 2810 }], outputs: [{ kind: "sake", quantity: 1800 }, { kind: "lees", quantity: 600 }] });
    expect(press.status).toBe(201);
    codes.sake = out(press);
    const before = await tableDigests();
    const badGtin = await event({ step: "bottling", inputs: [{ lot: codes.sake, quantity: 180 }], outputs: [{ kind: "bottled", quantity: 250, bottleMl: 720, gtin: "4006381333932" }] });
    expect(badGtin.status).toBe(422);
    expect(badGtin.body.error.fields["outputs.0.gtin"]).toEqual(["This GTIN's check digit is wrong (GS1 mod-10)."]);
    const mismatch = await event({ step: "bottling", inputs: [{ lot: codes.sake, quantity: 100 }], outputs: [{ kind: "bottled", quantity: 250, bottleMl: 720, gtin: "4006381333931" }] });
    expect(mismatch.body.error.fields["inputs.0.quantity"][0]).toMatch(/180 L/);
    expect(await tableDigests()).toEqual(before);
    const key = { "idempotency-key": "bottling-line-1" };
    const bottled = await event({ step: "bottling", inputs: [{ lot: codes.sake, quantity: 180 }], outputs: [{ kind: "bottled", quantity: 250, bottleMl: 720, gtin: "4006381333931" }] }, key);
    const again = await event({ step: "bottling", inputs: [{ lot: codes.sake, quantity: 180 }], outputs: [{ kind: "bottled", quantity: 250, bottleMl: 720, gtin: "4006381333931" }] }, key);
    expect(again.body).toEqual(bottled.body);
    expect((await lot(codes.sake)).onHand).toBe(1620);
    expect(await lot(out(bottled))).toMatchObject({ kind: "bottled", unit: "bottle", quantity: 250, attributes: { gtin: "4006381333931", bottleMl: 720 } });
  });
});
