import { randomBytes } from "node:crypto";
import { rmSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as claimsRoute } from "../../app/api/claims/[code]/route";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { POST as postCommit } from "../../app/api/import/commit/route";
import { POST as uploadRoute } from "../../app/api/lots/[code]/attachments/route";
import { translator } from "@/i18n/messages";
import { deliveryPrice } from "@/domain/supplier-prices";
import type { Translate } from "@/lib/validation/field-errors";
import { getDb, getSqlite } from "@/server/platform/db";
import { DEMO_USERS } from "@/server/records/seed";
import { addGrowerContract, currentGrowerContract } from "@/server/suppliers/supplier-contracts";
import { call, jsonRequest, ORIGIN, signInAs } from "../support/api";

// Rules of the NTA labelling standard for sake (清酒の製法品質表示基準, NTA Notification No. 8
// of 1989 as amended) and the MAFF inspection standard for brown rice, as tabled in
// ../shared/references.md. The seeded season: Tank 1 of 50 % rice by the ginjo method, no
// alcohol; Tank 3 of 60 % rice, 600 kg, with 40 kg of 95 % alcohol (src/server/records/seed-brewing.ts).
let admin: string, brewer: string, grower: string, sales: string;
const blobs: string[] = [];

beforeAll(async () => {
  admin = await signInAs("admin@example.com");
  brewer = await signInAs("brewer@example.com");
  grower = await signInAs("grower@example.com");
  sales = await signInAs("sales@example.com");
});
afterAll(() => {
  // Attachments are files beside the test database; they outlive it unless removed.
  for (const sha of blobs) rmSync(path.join(path.dirname(process.env.GRAINLINE_DB!), "files", sha.slice(0, 2), sha), { force: true });
});

const tankCode = (name: string) => (getSqlite().prepare("select code from lots where kind = 'tank' and json_extract(attributes, '$.tankName') = ?").get(name) as { code: string }).code;
const claims = async (code: string) => (await call(claimsRoute, jsonRequest(`/api/claims/${code}`, { cookie: sales }), { code })).body;
const eligible = (body: { categories: { name: string; eligible: boolean }[] }) => body.categories.filter((c) => c.eligible).map((c) => c.name);
const alcoholReading = (tank: string, measurements: { name: string; value: number; unit: string }[]) =>
  call(postEvent, jsonRequest("/api/events", { cookie: brewer, body: { step: "measuring", inputs: [{ lot: tank, quantity: 0 }], measurements } }));

describe("added alcohol is judged converted to 95 % alcohol", () => {
  it("refuses an alcohol addition without its strength, and changes nothing", async () => {
    const tank = tankCode("Tank 3");
    const before = getSqlite().prepare("select count(*) as n from measurements").get();
    const res = await alcoholReading(tank, [{ name: "addedAlcoholKg", value: 60, unit: "kg" }]);
    expect(res.status).toBe(422);
    expect(res.body.error.fields["measurements.addedAlcoholStrengthPct"]).toEqual(["Give the strength (% alcohol by volume) of the alcohol added: the labelling standard weighs it as 95 % alcohol."]);
    expect(getSqlite().prepare("select count(*) as n from measurements").get()).toEqual(before);
  });

  it("refuses a strength above 100 % or at 0", async () => {
    const tank = tankCode("Tank 3");
    for (const value of [0, 101]) {
      const res = await alcoholReading(tank, [{ name: "addedAlcoholKg", value: 60, unit: "kg" }, { name: "addedAlcoholStrengthPct", value, unit: "%" }]);
      expect(res.status).toBe(422);
      expect(Object.keys(res.body.error.fields)).toEqual(["measurements.addedAlcoholStrengthPct"]);
    }
  });

  it("60 kg more at 30 % is 18.9 kg at 95 %: 58.9 kg on 600 kg of rice is 9.8 %, still honjozo (raw weight, 100 kg, would be 16.7 %)", async () => {
    const tank = tankCode("Tank 3");
    const res = await alcoholReading(tank, [{ name: "addedAlcoholKg", value: 60, unit: "kg" }, { name: "addedAlcoholStrengthPct", value: 30, unit: "%" }]);
    expect(res.status).toBe(201);
    const body = await claims(tank);
    expect(body.addedAlcoholKg).toBe(100);
    // 40 × 95 ÷ 95 + 60 × 30 ÷ 95 = 40 + 18.947… (conversion by pure-alcohol content, as references.md works 30 kg at 30 %).
    expect(body.addedAlcohol95Kg).toBeCloseTo(58.947, 3);
    expect(eligible(body)).toEqual(["tokubetsu honjozo", "honjozo"]);
    expect(body.caution).toMatch(/local tax office/);
  });

  it("another 40 kg at 30 % (12.6 kg at 95 %) takes it to 11.9 %: above 10 %, no honjozo", async () => {
    const tank = tankCode("Tank 3");
    expect((await alcoholReading(tank, [{ name: "addedAlcoholKg", value: 40, unit: "kg" }, { name: "addedAlcoholStrengthPct", value: 30, unit: "%" }])).status).toBe(201);
    const body = await claims(tank);
    expect(eligible(body)).toEqual([]);
    expect(body.categories.find((c: { name: string }) => c.name === "honjozo").reasons).toEqual(["added alcohol 11.93 % of the rice weight (as 95 % alcohol) is above 10 %"]);
  });
});

/** Records an event, failing the test if it is refused; its first output's code. */
async function recorded(cookie: string, body: unknown): Promise<string> {
  const res = await call(postEvent, jsonRequest("/api/events", { cookie, body }));
  if (res.status !== 201) throw new Error(JSON.stringify(res.body));
  return (res.body.outputs as { code: string }[])[0]?.code ?? "";
}

/** One harvest graded equivalent, milled, and brewed into a ginjo tank through the API: the tank's code. */
async function brewFromEquivalentRice(): Promise<string> {
  const m = (name: string, value: number, unit: string) => ({ name, value, unit });
  const miller = await signInAs("miller@example.com");
  const body = { fieldId: "field-ikeda-terrace", variety: "Omachi", cropYear: 2026, brownKg: 800, moisturePct: 14.8, grade: "equivalent", bags: 13 };
  const harvest = (await call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body }))).body.code as string;
  // Each hand-over answers the holder's dispatch.
  await recorded(grower, { step: "shipping", inputs: [{ lot: harvest, quantity: 800 }], counterpartyId: "mill-shirotae", referenceDoc: `DS-${harvest}` });
  await recorded(miller, { step: "receiving", inputs: [{ lot: harvest, quantity: 800 }] });
  const polished = await recorded(miller, { step: "polishing", inputs: [{ lot: harvest, quantity: 800 }], outputs: [{ kind: "polished", quantity: 400 }], measurements: [m("targetPolishingRatioPct", 50, "%")] });
  await recorded(miller, { step: "shipping", inputs: [{ lot: polished, quantity: 400 }], counterpartyId: "brewery-kirinoha", referenceDoc: `DS-${polished}` });
  await recorded(brewer, { step: "receiving", inputs: [{ lot: polished, quantity: 400 }] });
  const soak = (dry: number, use: string) => recorded(brewer, { step: "soaking", inputs: [{ lot: polished, quantity: dry }], outputs: [{ kind: "soaked", quantity: dry * 1.3, use }], measurements: [m("soakMinutes", 10, "min"), m("waterTempC", 10, "°C")] });
  const steam = async (soaked: string, kg: number, out: number) => recorded(brewer, { step: "steaming", inputs: [{ lot: soaked, quantity: kg }], outputs: [{ kind: "steamed", quantity: out }], measurements: [m("steamMinutes", 50, "min")] });
  const koji = await recorded(brewer, { step: "koji-making", inputs: [{ lot: await steam(await soak(100, "koji"), 130, 140), quantity: 140 }], outputs: [{ kind: "koji", quantity: 120 }], measurements: [m("sporeG", 30, "g")] });
  const mash = await steam(await soak(300, "mash"), 390, 420);
  const split = await call(postEvent, jsonRequest("/api/events", { cookie: brewer, body: { step: "splitting", inputs: [{ lot: mash, quantity: 420 }], outputs: ["first", "middle", "final"].map((addition, n) => ({ kind: "steamed", quantity: [60, 120, 240][n], use: "mash", addition })) } }));
  const portions = (split.body.outputs as { code: string }[]).map((o) => o.code);
  const add = (addition: string, kojiKg: number, n: number, kg: number, tank?: string) =>
    recorded(brewer, { step: "mash-addition", attributes: { addition }, inputs: [{ lot: koji, quantity: kojiKg }, { lot: portions[n]!, quantity: kg }], outputs: [tank ? { lot: tank, quantity: kojiKg + kg } : { kind: "tank", quantity: kojiKg + kg, ginjoMethod: true }], measurements: [m("waterL", 0, "L")] });
  const tank = await add("first", 24, 0, 60);
  await add("middle", 36, 1, 120, tank);
  await add("final", 60, 2, 240, tank);
  return tank;
}

describe("rice certified equivalent to 3rd grade or better", () => {
  it("can be registered on a harvest, with the moisture ceiling of graded rice", async () => {
    const body = { fieldId: "field-ikeda-terrace", variety: "Omachi", cropYear: 2026, brownKg: 300, moisturePct: 14.6, grade: "equivalent", bags: 5 };
    const ok = await call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body }));
    expect(ok.status).toBe(201);
    expect(getSqlite().prepare("select grade from lots where code = ?").get(ok.body.code)).toEqual({ grade: "equivalent" });
    // MAFF: above 15.0 % moisture brown rice takes no grade, and no equivalence either.
    const wet = await call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body: { ...body, moisturePct: 15.04 } }));
    expect(wet.status).toBe(422);
    expect(Object.keys(wet.body.error.fields)).toEqual(["grade"]);
  });

  it("can be imported from a CSV of harvests", async () => {
    const rows = [{ line: 2, cells: ["field-ikeda-cedar", "Omachi", "2026", "240", "14.9", "Equivalent", "4", "2026-10-02"] }];
    const res = await call(postCommit, jsonRequest("/api/import/commit", { cookie: grower, body: { kind: "harvests", header: ["field", "variety", "cropYear", "brownKg", "moisturePct", "grade", "bags", "harvestedOn"], rows } }));
    expect(res.status).toBe(201);
    expect(getSqlite().prepare("select grade from lots where code = ?").get(res.body.created[0].code)).toEqual({ grade: "equivalent" });
  });

  it("counts for premium categories once its certificate is attached, and says it is missing before", async () => {
    // A ginjo tank brewed through the API from one harvest of uninspected rice certified
    // equivalent: 800 kg polished to 400 kg (50 %), 100 kg of it made into koji (25 %).
    const tank = await brewFromEquivalentRice();
    const sources = getSqlite().prepare("select distinct s.code, s.id from lot_source_deltas d join lots s on s.id = d.source_lot_id where d.lot_id = (select id from lots where code = ?)").all(tank) as { code: string; id: number }[];
    expect(sources.length).toBe(1);

    const missing = await claims(tank);
    expect(missing.lowestGrade).toBe("equivalent");
    expect(eligible(missing)).toEqual([]);
    const codes = sources.map((s) => s.code).sort().join(", ");
    expect(missing.categories[0].reasons).toEqual([`rice graded equivalent to 3rd grade has no certificate attached (${codes})`]);

    for (const s of sources) {
      const form = new FormData();
      const pdf = Buffer.concat([Buffer.from(`%PDF-1.4\n%${randomBytes(8).toString("hex")}\n`), Buffer.alloc(200, 0x20)]);
      form.append("file", new File([new Uint8Array(pdf)], "equivalence-certificate.pdf", { type: "application/pdf" }));
      form.append("title", "Certificate of equivalence to 3rd grade");
      const up = await call(uploadRoute, new Request(`${ORIGIN}/api/lots/${s.code}/attachments`, { method: "POST", body: form, headers: { host: "localhost:3000", cookie: admin } }), { code: s.code });
      expect(up.status).toBe(201);
      blobs.push(up.body.sha256);
    }
    const certified = await claims(tank);
    expect(eligible(certified)).toEqual(["junmai daiginjo", "junmai ginjo", "tokubetsu junmai", "junmai"]);
  });
});

describe("a grower contract sets its own moisture threshold", () => {
  const en = translator("en");
  const t: Translate = (key, values) => en(key as never, values as never);
  const office = DEMO_USERS.find((u) => u.id === "user-admin")!;
  // Invented terms; the 15.0 % default is MAFF's moisture ceiling for graded brown rice.
  const terms = { variety: "Dewasansan", cropYear: 2026, prices: { "1": "26000", equivalent: "24000" }, moistureStepPct: "0.5", moistureDeductionYen: "200" };

  it("keeps the threshold and the 0.5-point step, and prices a delivery from them: 15.51 % over 15.0 % is two steps", () => {
    addGrowerContract(office, "grower-nakase", { ...terms, moistureThresholdPct: "" }, t);
    const contract = currentGrowerContract(getDb(), "grower-nakase", "Dewasansan", 2026)!;
    expect(contract.terms.moisture).toEqual({ thresholdPct: 15, stepPct: 0.5, deductionYenPerBagPerStep: 200 });
    expect(contract.terms.pricesPerBagYen).toEqual({ "1": 26_000, equivalent: 24_000 });
    // 600 kg = 10 bags × (26,000 − 2 × 200) = 256,000 yen.
    expect(deliveryPrice(26_000, 600, 15.51, contract.terms.moisture)).toMatchObject({ steps: 2, amountYen: 256_000 });
  });

  it("a stricter 14.5 % threshold takes the place of 15.0 %", () => {
    addGrowerContract(office, "grower-nakase", { ...terms, moistureThresholdPct: "14.5" }, t);
    const contract = currentGrowerContract(getDb(), "grower-nakase", "Dewasansan", 2026)!;
    expect(contract.terms.moisture.thresholdPct).toBe(14.5);
    expect(deliveryPrice(26_000, 600, 15.0, contract.terms.moisture).steps).toBe(1);
  });

  it("refuses a threshold given finer than hundredths, or outside 10–20 %, by the field", () => {
    for (const bad of ["15.045", "9.9", "abc"]) {
      try {
        addGrowerContract(office, "grower-nakase", { ...terms, moistureThresholdPct: bad }, t);
        expect.unreachable(bad);
      } catch (e) {
        expect(Object.keys((e as { fields: Record<string, string[]> }).fields)).toEqual(["moistureThresholdPct"]);
      }
    }
  });
});
