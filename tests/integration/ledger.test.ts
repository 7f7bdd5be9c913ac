import { beforeAll, describe, expect, it } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as getLotRoute } from "../../app/api/lots/[code]/route";
import { GET as getLotEvents } from "../../app/api/lots/[code]/events/route";
import { getSqlite } from "@/server/platform/db";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";
import { dispatchAndReceive } from "../support/receipts";

let grower: string, grower2: string, miller: string, admin: string;

const harvest = (cookie: string, body: Record<string, unknown>, headers: Record<string, string> = {}) =>
  call(postHarvest, jsonRequest("/api/harvests", { cookie, body: { fieldId: "field-ikeda-terrace", variety: "Yamada Nishiki", cropYear: 2026, brownKg: 600, moisturePct: 14.8, grade: "1", bags: 10, ...body }, headers }));
const event = (cookie: string, body: unknown, headers: Record<string, string> = {}) => call(postEvent, jsonRequest("/api/events", { cookie, body, headers }));
const lot = async (cookie: string, code: string) => (await call(getLotRoute, jsonRequest(`/api/lots/${code}`, { cookie }), { code })).body;
const atMill = (code: string, quantity: number, receipt: Record<string, unknown> = {}) => dispatchAndReceive(admin, miller, code, quantity, { receipt });

beforeAll(async () => {
  grower = await signInAs("grower@example.com");
  grower2 = await signInAs("grower2@example.com");
  miller = await signInAs("miller@example.com");
  admin = await signInAs("admin@example.com");
});

describe("append-only at the database", () => {
  it("refuses UPDATE and DELETE on events and their rows", async () => {
    const res = await harvest(grower, {});
    expect(res.status).toBe(201);
    // One row in every ledger table, so that each trigger has something to guard.
    await atMill(res.body.code, 600);
    const measured = await event(miller, { step: "measuring", inputs: [{ lot: res.body.code, quantity: 0 }], measurements: [{ name: "moisturePct", value: 14.6, unit: "%" }] });
    expect(measured.status).toBe(201);
    const sqlite = getSqlite();
    for (const table of ["events", "event_inputs", "event_outputs", "measurements"]) {
      expect((sqlite.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n, table).toBeGreaterThan(0);
    }
    for (const statement of [
      "update events set note = 'changed'",
      "delete from events",
      "update event_outputs set quantity = 1",
      "delete from event_outputs",
      "update event_inputs set quantity = 1",
      "delete from event_inputs",
      "update measurements set value = 0",
      "delete from measurements",
    ]) {
      expect(() => sqlite.prepare(statement).run(), statement).toThrow(/append-only/);
    }
  });

  it("fixes what a lot is when it is made, and never deletes one; its running totals still move", async () => {
    const res = await harvest(grower, {});
    expect(res.status).toBe(201);
    const sqlite = getSqlite();
    const before = sqlite.prepare("select * from lots where code = ?").get(res.body.code);
    for (const set of ["code = 'X-1'", "kind = 'polished'", "unit = 'L'", "grade = 'equivalent'", "polishing_ratio_pct = 55", "attributes = '{}'", "variety = 'Yamadanishiki'", "crop_year = 2001", "field_id = null", "origin_party_id = party_id", "created_at = 0", "id = id + 100000"]) {
      expect(() => sqlite.prepare(`update lots set ${set} where code = ?`).run(res.body.code), set).toThrow(/fixed when it is made/);
    }
    expect(() => sqlite.prepare("delete from lots where code = ?").run(res.body.code)).toThrow(/never deleted/);
    expect(sqlite.prepare("select * from lots where code = ?").get(res.body.code)).toEqual(before);
    // Totals and the holder are kept with each event, in its transaction.
    expect(sqlite.prepare("update lots set on_hand = on_hand, content_in = content_in, quantity_in = quantity_in, party_id = party_id, in_transit_to = in_transit_to, moisture_pct = moisture_pct where code = ?").run(res.body.code).changes).toBe(1);
  });
});

describe("harvest lots", () => {
  it("registers on the grower's own field with a GS1-safe code", async () => {
    const res = await harvest(grower, { brownKg: 720, bags: 12 });
    expect(res.status).toBe(201);
    expect(res.body.code).toMatch(/^H26-\d{4}$/);
    const created = await lot(grower, res.body.code);
    expect(created).toMatchObject({ kind: "harvest", unit: "kg", quantity: 720, onHand: 720, variety: "Yamada Nishiki", cropYear: 2026, grade: "1", moisturePct: 14.8, party: { id: "grower-ikeda" }, field: { id: "field-ikeda-terrace", region: "Hyogo" } });
  });

  it("answers another grower's field as unknown (422) and changes nothing", async () => {
    const before = await tableDigests();
    const res = await harvest(grower2, {});
    expect(res.status).toBe(422);
    expect(res.body.error.fields.fieldId).toEqual(["Choose one of your fields."]);
    expect(await tableDigests()).toEqual(before);
  });

  it("answers 422 with field errors for a bad harvest, changing nothing", async () => {
    const before = await tableDigests();
    const res = await harvest(grower, { brownKg: -5, grade: "premium", cropYear: 1890, variety: "" });
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(["brownKg", "cropYear", "grade", "variety"]);
    // MAFF: above 15.0 % moisture brown rice takes no grade.
    const wet = await harvest(grower, { moisturePct: 16.2, grade: "2" });
    expect(wet.status).toBe(422);
    expect(wet.body.error.fields.grade).toBeDefined();
    expect(await tableDigests()).toEqual(before);
  });

  it("is not visible to another grower", async () => {
    const res = await harvest(grower, {});
    expect((await call(getLotRoute, jsonRequest(`/api/lots/${res.body.code}`, { cookie: grower2 }), { code: res.body.code })).status).toBe(404);
  });
});

describe("receipt and polishing run at the mill", () => {
  let h1: string, h2: string;
  beforeAll(async () => {
    h1 = (await harvest(grower, { brownKg: 600 })).body.code;
    h2 = (await harvest(admin, { fieldId: "field-nakase-river", brownKg: 400, grade: "2" })).body.code;
    for (const [code, from] of [[h1, "grower-ikeda"], [h2, "grower-nakase"]] as const) {
      const qty = (await lot(admin, code)).onHand;
      const res = await atMill(code, qty, { counterpartyId: from, referenceDoc: `DS-${code}` });
      expect(res.status).toBe(201);
    }
  });

  it("moves the received lots to the mill", async () => {
    expect((await lot(miller, h1)).party.id).toBe("mill-shirotae");
  });

  it("makes a polished lot and a bran lot from two harvest lots, with the achieved ratio", async () => {
    const res = await event(miller, {
      step: "polishing",
      inputs: [{ lot: h1, quantity: 600 }, { lot: h2, quantity: 400 }],
      outputs: [{ kind: "polished", quantity: 600 }, { kind: "bran", quantity: 385 }],
      measurements: [
        { name: "targetPolishingRatioPct", value: 60, unit: "%" },
        { name: "thousandGrainWeightBrownG", value: 27, unit: "g" },
        { name: "thousandGrainWeightPolishedG", value: 16.6, unit: "g" },
      ],
    });
    expect(res.status).toBe(201);
    expect(res.body.warnings).toEqual([]);
    const [polished, bran] = res.body.outputs;
    expect(polished).toMatchObject({ kind: "polished", quantity: 600, unit: "kg" });
    expect(bran).toMatchObject({ kind: "bran", quantity: 385 });
    const p = await lot(miller, polished.code);
    expect(p.polishingRatioPct).toBe(60);
    expect(p.grade).toBe("2"); // the worse of the two
    const [run] = (await call(getLotEvents, jsonRequest(`/api/lots/${polished.code}/events`, { cookie: miller }), { code: polished.code })).body.items;
    expect(run.attributes).toMatchObject({ brownKg: 1000, achievedPolishingRatioPct: 60, truePolishingRatioPct: 61.5, branYieldPct: 38.5 });
    expect(run.inputs.map((i: { lot: string }) => i.lot).sort()).toEqual([h1, h2].sort());
    // Lineage by brown weight: 60 % from the first harvest, 40 % from the second.
    const edges = getSqlite()
      .prepare("select p.code as parent, e.weight / c.content_in as share from lineage_edges e join lots p on p.id = e.parent_lot_id join lots c on c.id = e.child_lot_id where c.code = ?")
      .all(polished.code) as { parent: string; share: number }[];
    expect(Object.fromEntries(edges.map((e) => [e.parent, e.share]))).toEqual({ [h1]: 0.6, [h2]: 0.4 });
    expect(() => getSqlite().prepare("update lineage_edges set weight = 0").run()).toThrow(/append-only/);
    expect(() => getSqlite().prepare("delete from lineage_edges").run()).toThrow(/append-only/);
  });

  it("warns when the run misses its target by more than a point", async () => {
    const h = (await harvest(grower, { brownKg: 500 })).body.code;
    await atMill(h, 500);
    const res = await event(miller, {
      step: "polishing",
      inputs: [{ lot: h, quantity: 500 }],
      outputs: [{ kind: "polished", quantity: 310 }],
      measurements: [{ name: "targetPolishingRatioPct", value: 60, unit: "%" }],
    });
    expect(res.status).toBe(201);
    expect(res.body.warnings).toEqual(["Achieved polishing ratio 62 % is more than 1 point from the target 60 %."]);
  });

  it("refuses an over-draw with 409 and leaves every table as it was", async () => {
    const h = (await harvest(grower, { brownKg: 300 })).body.code;
    await atMill(h, 300);
    const before = await tableDigests();
    const res = await event(miller, { step: "polishing", inputs: [{ lot: h, quantity: 300.5 }], outputs: [{ kind: "polished", quantity: 200 }], measurements: [{ name: "targetPolishingRatioPct", value: 70, unit: "%" }] });
    expect(res.status).toBe(409);
    expect(res.body.error.fields["inputs.0.quantity"][0]).toMatch(/300 kg/);
    expect(await tableDigests()).toEqual(before);
  });

  it("records an event once for one Idempotency-Key", async () => {
    const h = (await harvest(grower, { brownKg: 200 })).body.code;
    await atMill(h, 200);
    const body = { step: "polishing", inputs: [{ lot: h, quantity: 100 }], outputs: [{ kind: "polished", quantity: 70 }], measurements: [{ name: "targetPolishingRatioPct", value: 70, unit: "%" }] };
    const headers = { "idempotency-key": "floor-7f3a" };
    const first = await event(miller, body, headers);
    const again = await event(miller, body, headers);
    expect(again.status).toBe(201);
    expect(again.body).toEqual(first.body);
    expect((await lot(miller, h)).onHand).toBe(100);
    const other = await event(miller, { ...body, inputs: [{ lot: h, quantity: 50 }] }, headers);
    expect(other.status).toBe(409);
  });
});

describe("corrections", () => {
  it("reverses a polishing run with a reason; both show on the lot's page; never twice", async () => {
    const h = (await harvest(grower, { brownKg: 250 })).body.code;
    await atMill(h, 250);
    const run = await event(miller, { step: "polishing", inputs: [{ lot: h, quantity: 250 }], outputs: [{ kind: "polished", quantity: 175 }], measurements: [{ name: "targetPolishingRatioPct", value: 70, unit: "%" }] });
    const polished = run.body.outputs[0].code;

    const noReason = await event(admin, { step: "correcting", corrects: run.body.id });
    expect(noReason.status).toBe(422);
    expect(noReason.body.error.fields.reason).toBeDefined();
    const notTheirs = await event(grower, { step: "correcting", corrects: run.body.id, reason: "wrong bag" });
    expect(notTheirs.status).toBe(403);

    const fix = await event(admin, { step: "correcting", corrects: run.body.id, reason: "Weighed on the wrong scale" });
    expect(fix.status).toBe(201);
    expect((await lot(miller, h)).onHand).toBe(250);
    expect((await lot(miller, polished)).onHand).toBe(0);
    const history = (await call(getLotEvents, jsonRequest(`/api/lots/${h}/events`, { cookie: admin }), { code: h })).body.items;
    const steps = history.map((e: { step: string }) => e.step);
    expect(steps).toEqual(["registering", "shipping", "receiving", "polishing", "correcting"]);
    expect(history[3].correctedBy).toBe(fix.body.id);
    expect(history[4]).toMatchObject({ corrects: run.body.id, reason: "Weighed on the wrong scale", user: { name: "Mori Sachiko" } });
    const twice = await event(admin, { step: "correcting", corrects: run.body.id, reason: "again" });
    expect(twice.status).toBe(409);
    // The reversed edges cancel: the emptied polished lot carries no share of anything.
    const net = getSqlite().prepare("select sum(weight) as w from lineage_edges e join lots c on c.id = e.child_lot_id where c.code = ?").get(polished) as { w: number };
    expect(Math.abs(net.w)).toBeLessThan(1e-9);
  });

  it("hands a received lot back to the sender", async () => {
    const h = (await harvest(grower, { brownKg: 90 })).body.code;
    const receipt = await atMill(h, 90);
    await event(miller, { step: "correcting", corrects: receipt.body.id, reason: "Bag belonged to the next truck" });
    expect((await lot(admin, h)).party.id).toBe("grower-ikeda");
  });
});

describe("on hand follows from the events", () => {
  it("equals what the event rows add up to, for every lot", () => {
    const rows = getSqlite()
      .prepare(
        `select l.code, l.on_hand as onHand,
           coalesce((select sum(quantity) from event_outputs o where o.lot_id = l.id), 0)
         - coalesce((select sum(quantity) from event_inputs i where i.lot_id = l.id and i.use = 'draw'), 0) as fromEvents
         from lots l`,
      )
      .all() as { code: string; onHand: number; fromEvents: number }[];
    expect(rows.length).toBeGreaterThan(5);
    for (const r of rows) expect(r.onHand, r.code).toBeCloseTo(r.fromEvents, 9);
  });
});

describe("a lot someone cannot see is unknown to them, not forbidden", () => {
  it("another grower's harvest is refused exactly like a code that does not exist; nothing changes", async () => {
    const theirs = (await harvest(grower, { brownKg: 120 })).body.code as string;
    const before = await tableDigests();
    const measuring = (code: string) => ({ step: "measuring", inputs: [{ lot: code, quantity: 0 }], measurements: [{ name: "moisturePct", value: 14.2, unit: "%" }] });
    const hidden = await event(grower2, measuring(theirs));
    const missing = await event(grower2, measuring("H26-9999"));
    expect(hidden.status).toBe(422);
    expect(hidden.body).toEqual(missing.body);
    expect(await tableDigests()).toEqual(before);
    // The GET agrees: 404 for both.
    expect((await call(getLotRoute, jsonRequest(`/api/lots/${theirs}`, { cookie: grower2 }), { code: theirs })).status).toBe(404);
  });

  it("a lot someone can see but does not hold is still 403 (../shared/api.md: ownership forbids it)", async () => {
    const code = (await harvest(grower, { brownKg: 130 })).body.code as string;
    await atMill(code, 130);
    // The grower made it and still sees it; the mill holds it now.
    const res = await event(grower, { step: "shipping", inputs: [{ lot: code, quantity: 130 }], counterpartyId: "brewery-kirinoha" });
    expect(res.status).toBe(403);
  });

  it("a receipt that answers a dispatch takes the weight on arrival; a receiver who cannot see a lot learns nothing of its weight", async () => {
    const code = (await harvest(grower, { brownKg: 140 })).body.code as string;
    // Undispatched, any weight is the same answer: it waits for the sender, and says nothing of 140.
    const wrong = await event(miller, { step: "receiving", inputs: [{ lot: code, quantity: 100 }] });
    expect(wrong.status).toBe(202);
    expect(JSON.stringify(wrong.body)).not.toContain("140");
    const res = await atMill(code, 139.5);
    expect(res.status).toBe(201);
    expect((await lot(miller, code)).onHand).toBe(139.5);
  });

  it("a receipt that cannot be says why, beside the lot: already yours, or not the named sender's", async () => {
    const code = (await harvest(grower, { brownKg: 150 })).body.code as string;
    await event(grower, { step: "shipping", inputs: [{ lot: code, quantity: 150 }], counterpartyId: "mill-shirotae", referenceDoc: "DS-150" });
    const before = await tableDigests();
    // The lot is addressed to the mill, so the mill may be told the sender it named is wrong.
    const wrongSender = await event(miller, { step: "receiving", inputs: [{ lot: code, quantity: 150 }], counterpartyId: "grower-nakase" });
    expect(wrongSender.status).toBe(409);
    expect(wrongSender.body.error.fields).toEqual({ "inputs.0.lot": [`Lot ${code} is not held by the sender.`] });
    expect(await tableDigests()).toEqual(before);
    expect((await event(miller, { step: "receiving", inputs: [{ lot: code, quantity: 150 }] })).status).toBe(201);
    const again = await event(miller, { step: "receiving", inputs: [{ lot: code, quantity: 150 }] });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ message: `Lot ${code} is already held by your party.`, fields: { "inputs.0.lot": [`Lot ${code} is already held by your party.`] } });
  });
});

describe("a receipt takes only what travels to its receiver (src/domain/steps.ts RECEIVABLE_KINDS)", () => {
  /** A lot of this kind the brewery holds and has stock of; `madeBy` filters on who made it. */
  const brewery = (kind: string, madeBy = "%") =>
    getSqlite()
      .prepare("select code, on_hand as onHand from lots where kind = ? and party_id = 'brewery-kirinoha' and origin_party_id like ? and on_hand > 0 order by id limit 1")
      .get(kind, madeBy) as { code: string; onHand: number };

  it("the mill naming a brewery lot it cannot see gets the answer a missing code gets, and takes nothing", async () => {
    // The demo brewery has stock of these kinds, made in its own house; none ever goes to a mill.
    const kinds = getSqlite().prepare("select distinct kind from lots where party_id = 'brewery-kirinoha' and origin_party_id = party_id and on_hand > 0 order by kind").pluck().all() as string[];
    expect(kinds).toEqual(expect.arrayContaining(["bottled", "lees", "sake"]));
    for (const kind of kinds) {
      const theirs = brewery(kind, "brewery-kirinoha");
      // Both wait for a sender (a request row each); no lot changes hands.
      const before = await tableDigests(["receipt_requests"]);
      const taken = await event(miller, { step: "receiving", inputs: [{ lot: theirs.code, quantity: theirs.onHand }] });
      const missing = await event(miller, { step: "receiving", inputs: [{ lot: "BT26-9999", quantity: theirs.onHand }] });
      expect(taken.status, kind).toBe(202);
      expect(taken.body, kind).toEqual(missing.body);
      expect(await tableDigests(["receipt_requests"]), kind).toEqual(before);
    }
  });

  it("a lot the receiver can see but does not take in is refused by its kind: polished rice back at the mill", async () => {
    // The mill made it and still sees it; the office sees every lot and records for the mill.
    const polished = brewery("polished", "mill-shirotae");
    const before = await tableDigests();
    for (const [cookie, partyId] of [[miller, undefined], [admin, "mill-shirotae"]] as const) {
      const res = await event(cookie, { step: "receiving", partyId, inputs: [{ lot: polished.code, quantity: polished.onHand }] });
      expect(res.status).toBe(422);
      expect(res.body.error.fields["inputs.0.lot"]).toEqual(["This step (Received) cannot use a lot of this kind (Polished rice)."]);
    }
    expect(await tableDigests()).toEqual(before);
  });

  it("the mill takes in brown rice the brewery bought, to polish it for the brewery", async () => {
    const code = (await harvest(admin, { brownKg: 180 })).body.code as string;
    expect((await dispatchAndReceive(admin, admin, code, 180, { to: "brewery-kirinoha", receipt: { partyId: "brewery-kirinoha" } })).status).toBe(201);
    const res = await dispatchAndReceive(admin, miller, code, 180, { receipt: { counterpartyId: "brewery-kirinoha" } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect((await lot(admin, code)).party.id).toBe("mill-shirotae");
  });
});
