import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as traceRoute } from "../../app/api/trace/[code]/route";
import { getSqlite } from "@/server/platform/db";
import { call, jsonRequest, signInAs } from "../support/api";

// Hand-computed scenarios (shares by the mixing rule of ../shared/product.md, "The model").
let grower: string, miller: string, brewer: string, sales: string;
const m = (name: string, value: number, unit: string) => ({ name, value, unit });
const event = async (cookie: string, body: unknown) => {
  const res = await call(postEvent, jsonRequest("/api/events", { cookie, body }));
  if (res.status !== 201) throw new Error(JSON.stringify(res.body));
  return res.body as { id: number; outputs: { code: string }[] };
};
const code = (r: { outputs: { code: string }[] }, n = 0) => r.outputs[n]!.code;
const trace = async (lot: string, direction: "backward" | "forward", cookie = sales) =>
  (await call(traceRoute, jsonRequest(`/api/trace/${lot}?direction=${direction}`, { cookie }), { code: lot })).body;
const shares = (body: { sources: { code: string; share: number }[] }) => Object.fromEntries(body.sources.map((s) => [s.code, s.share]));

/** The bare recursive walk over lineage edges: an independent cross-check of the composition index. */
function walkEdges(lotId: number): Map<number, number> {
  const rows = getSqlite()
    .prepare(
      `with recursive up(lot_id, frac) as (
         select ?, 1.0
         union all
         select e.parent_lot_id, up.frac * e.weight / c.content_in
         from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = up.lot_id
         where c.content_in > 0)
       select up.lot_id as id, sum(frac) as share from up join lots l on l.id = up.lot_id
       where l.kind = 'harvest' group by up.lot_id having abs(sum(frac)) > 1e-9`,
    )
    .all(lotId) as { id: number; share: number }[];
  return new Map(rows.map((r) => [r.id, r.share]));
}

const h: Record<string, string> = {};
const lots: Record<string, string> = {};

beforeAll(async () => {
  [grower, miller, brewer, sales] = [await signInAs("grower@example.com"), await signInAs("miller@example.com"), await signInAs("brewer@example.com"), await signInAs("sales@example.com")];
  const harvest = async (brownKg: number) =>
    (await call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body: { fieldId: "field-ikeda-cedar", variety: "Omachi", cropYear: 2026, brownKg, moisturePct: 14.5, grade: "2", bags: 5 } }))).body.code as string;
  [h.one, h.two, h.three] = [await harvest(600), await harvest(400), await harvest(500)];
  // Each receipt answers the sender's dispatch (a receipt needs the sender's word).
  const send = (cookie: string, lot: string, kg: number, to: string) => event(cookie, { step: "shipping", inputs: [{ lot, quantity: kg }], counterpartyId: to, referenceDoc: `DS-${lot}` });
  for (const [lot, kg] of [[h.one, 600], [h.two, 400], [h.three, 500]] as const) {
    await send(grower, lot, kg, "mill-shirotae");
    await event(miller, { step: "receiving", inputs: [{ lot, quantity: kg }] });
  }
  const target = [m("targetPolishingRatioPct", 70, "%")];
  lots.pa = code(await event(miller, { step: "polishing", inputs: [{ lot: h.one, quantity: 600 }, { lot: h.two, quantity: 400 }], outputs: [{ kind: "polished", quantity: 700 }], measurements: target }));
  lots.pb = code(await event(miller, { step: "polishing", inputs: [{ lot: h.three, quantity: 500 }], outputs: [{ kind: "polished", quantity: 350 }], measurements: target }));
  for (const [lot, kg] of [[lots.pa, 700], [lots.pb, 350]] as const) {
    await send(miller, lot, kg, "brewery-kirinoha");
    await event(brewer, { step: "receiving", inputs: [{ lot, quantity: kg }] });
  }

  const soak = (lot: string, dry: number, use: string) => event(brewer, { step: "soaking", inputs: [{ lot, quantity: dry }], outputs: [{ kind: "soaked", quantity: dry * 1.3, use }], measurements: [m("soakMinutes", 10, "min"), m("waterTempC", 10, "°C")] });
  const steam = (lot: string, kg: number, out: number) => event(brewer, { step: "steaming", inputs: [{ lot, quantity: kg }], outputs: [{ kind: "steamed", quantity: out }], measurements: [m("steamMinutes", 50, "min")] });
  // Koji: 100 kg of rice from PA. Mash: 300 kg of rice from PB, split into three portions.
  const stKoji = code(await steam(code(await soak(lots.pa, 100, "koji")), 130, 140));
  lots.koji = code(await event(brewer, { step: "koji-making", inputs: [{ lot: stKoji, quantity: 140 }], outputs: [{ kind: "koji", quantity: 120 }], measurements: [m("sporeG", 30, "g")] }));
  const stMash = code(await steam(code(await soak(lots.pb, 300, "mash")), 390, 420));
  const split = await event(brewer, { step: "splitting", inputs: [{ lot: stMash, quantity: 420 }], outputs: ["first", "middle", "final"].map((addition, n) => ({ kind: "steamed", quantity: [60, 120, 240][n], use: "mash", addition })) });
  const add = (addition: string, koji: number, portion: string, kg: number, tank?: string) =>
    event(brewer, { step: "mash-addition", attributes: { addition }, inputs: [{ lot: lots.koji, quantity: koji }, { lot: portion, quantity: kg }], outputs: [tank ? { lot: tank, quantity: koji + kg } : { kind: "tank", quantity: koji + kg }], measurements: [m("waterL", 0, "L")] });
  lots.tank = code(await add("first", 24, code(split, 0), 60));
  await add("middle", 36, code(split, 1), 120, lots.tank);
  await add("final", 60, code(split, 2), 240, lots.tank);
  lots.s1 = code(await event(brewer, { step: "pressing", inputs: [{ lot: lots.tank, quantity: 540 }], outputs: [{ kind: "sake", quantity: 1000 }] }));

  // A second tank of PA rice alone, pressed to 500 L.
  const st2 = code(await steam(code(await soak(lots.pa, 200, "mash")), 260, 280));
  const tank2 = code(await event(brewer, { step: "mash-addition", attributes: { addition: "first" }, inputs: [{ lot: st2, quantity: 280 }], outputs: [{ kind: "tank", quantity: 280 }], measurements: [m("waterL", 0, "L")] }));
  lots.s2 = code(await event(brewer, { step: "pressing", inputs: [{ lot: tank2, quantity: 280 }], outputs: [{ kind: "sake", quantity: 500 }] }));
  lots.blend = code(await event(brewer, { step: "blending", inputs: [{ lot: lots.s1, quantity: 300 }, { lot: lots.s2, quantity: 200 }], outputs: [{ kind: "blend", quantity: 500 }] }));
  lots.bottled = code(await event(brewer, { step: "bottling", inputs: [{ lot: lots.blend, quantity: 72 }], outputs: [{ kind: "bottled", quantity: 100, bottleMl: 720, gtin: "09506000134352" }] }));
});

describe("backward trace", () => {
  it("merge at polishing: 60 / 40 by brown weight", async () => {
    const body = await trace(lots.pa!, "backward");
    expect(body.lot).toEqual({ code: lots.pa, kind: "polished" });
    expect(shares(body)).toEqual({ [h.one!]: 0.6, [h.two!]: 0.4 });
    expect(body.sources[0]).toMatchObject({ variety: "Omachi", cropYear: 2026, grade: "2", grower: { id: "grower-ikeda", name: "Ikeda Farm" }, field: { id: "field-ikeda-cedar", region: "Hyogo" } });
  });

  it("three additions into one tank from two polished lots: 100 kg rice from PA, 300 kg from PB", async () => {
    const s = shares(await trace(lots.tank!, "backward"));
    expect(s[h.one!]).toBeCloseTo(0.15, 12);
    expect(s[h.two!]).toBeCloseTo(0.1, 12);
    expect(s[h.three!]).toBeCloseTo(0.75, 12);
  });

  it("a blend of two sakes by volume, and its bottling", async () => {
    // 300 L of sake 1 (0.15 / 0.10 / 0.75) + 200 L of sake 2 (0.6 / 0.4 / 0).
    for (const lot of [lots.blend!, lots.bottled!]) {
      const body = await trace(lot, "backward");
      const s = shares(body);
      expect(s[h.one!]).toBeCloseTo(0.33, 12);
      expect(s[h.two!]).toBeCloseTo(0.22, 12);
      expect(s[h.three!]).toBeCloseTo(0.45, 12);
      expect(body.sources.reduce((a: number, x: { share: number }) => a + x.share, 0)).toBeCloseTo(1, 12);
    }
  });
});

describe("forward trace", () => {
  it("from a harvest lot reaches every descendant with the fraction it gave", async () => {
    const body = await trace(h.three!, "forward");
    const reached = Object.fromEntries(body.reached.map((r: { code: string; fraction: number }) => [r.code, r.fraction]));
    expect(reached[lots.pb!]).toBeCloseTo(1, 12);
    expect(reached[lots.tank!]).toBeCloseTo(0.75, 12);
    expect(reached[lots.s1!]).toBeCloseTo(0.75, 12);
    expect(reached[lots.blend!]).toBeCloseTo(0.45, 12);
    expect(reached[lots.bottled!]).toBeCloseTo(0.45, 12);
    expect(reached[lots.s2!]).toBeUndefined();
  });

  it("from an intermediate lot walks the edges down", async () => {
    const body = await trace(lots.pa!, "forward");
    const reached = Object.fromEntries(body.reached.map((r: { code: string; fraction: number }) => [r.code, r.fraction]));
    expect(reached[lots.koji!]).toBeCloseTo(1, 12);
    expect(reached[lots.tank!]).toBeCloseTo(0.25, 12);
    // Blend: 0.6 × 0.25 + 0.4 × 1.
    expect(reached[lots.blend!]).toBeCloseTo(0.55, 12);
  });
});

describe("the composition index agrees with the edges", () => {
  it("for every lot in the ledger (seeded seasons and the scenario above)", () => {
    const all = getSqlite().prepare("select id, code, content_in as c from lots where content_in > 0").all() as { id: number; code: string; c: number }[];
    expect(all.length).toBeGreaterThan(50);
    for (const lot of all) {
      const kept = new Map(
        (getSqlite().prepare("select source_lot_id as s, sum(amount) as a from lot_source_deltas where lot_id = ? group by source_lot_id having abs(sum(amount)) > 1e-9").all(lot.id) as { s: number; a: number }[]).map((r) => [r.s, r.a / lot.c]),
      );
      const walked = walkEdges(lot.id);
      const harvest = (getSqlite().prepare("select kind from lots where id = ?").get(lot.id) as { kind: string }).kind === "harvest";
      if (harvest) continue;
      expect([...kept.keys()].sort(), lot.code).toEqual([...walked.keys()].sort());
      for (const [source, share] of kept) expect(share, `${lot.code} ← ${source}`).toBeCloseTo(walked.get(source)!, 9);
    }
  });
});
