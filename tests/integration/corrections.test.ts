// Correction after hand-over (issue 12, item 2): once a lot has moved on, only the office of
// the party holding it now (or the brewery's admin) may correct the events that recorded on it.
import { beforeAll, describe, expect, it, vi } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as getLotEvents } from "../../app/api/lots/[code]/events/route";
import { GET as getLedger } from "../../app/api/suppliers/[partyId]/ledger/route";
import { getSqlite } from "@/server/platform/db";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";
import { submit } from "../support/action-scope";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

let admin: string, grower: string, miller: string, brewer: string;

type Ev = { id: number; step: string; corrects: number | null; reason: string; user: { name: string } };
const event = (cookie: string, body: unknown) => call(postEvent, jsonRequest("/api/events", { cookie, body }));
const history = async (cookie: string, code: string) => (await call(getLotEvents, jsonRequest(`/api/lots/${code}/events`, { cookie }), { code })).body.items as Ev[];
const harvest = async (brownKg: number) =>
  (await call(postHarvest, jsonRequest("/api/harvests", { cookie: grower, body: { fieldId: "field-ikeda-terrace", variety: "Yamada Nishiki", cropYear: 2026, brownKg, moisturePct: 14.8, grade: "1", bags: 10 } }))).body.code as string;
const holderOf = (code: string) => (getSqlite().prepare("select party_id as p from lots where code = ?").get(code) as { p: string }).p;
const registeringOf = (code: string) =>
  (getSqlite().prepare("select e.id from events e join event_outputs o on o.event_id = e.id join lots l on l.id = o.lot_id where l.code = ? and e.step = 'registering'").get(code) as { id: number }).id;
const correct = (cookie: string, corrects: number, reason = "Bags counted twice at the farm") => event(cookie, { step: "correcting", corrects, reason });

/** A hand-over: the holder dispatches the lot with its slip, the receiver takes it in. Answers the receipt's id. */
async function handOver(code: string, kg: number, from: string, to: string, receiver: string) {
  const sent = await event(from, { step: "shipping", inputs: [{ lot: code, quantity: kg }], counterpartyId: to, referenceDoc: `DS-C-${code}` });
  expect(sent.status, JSON.stringify(sent.body)).toBe(201);
  const res = await event(receiver, { step: "receiving", inputs: [{ lot: code, quantity: kg }], referenceDoc: `DS-C-${code}` });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  expect(holderOf(code)).toBe(to);
  return res.body.id as number;
}
const receiveAtMill = (code: string, kg: number) => handOver(code, kg, grower, "mill-shirotae", miller);

beforeAll(async () => {
  admin = await signInAs("admin@example.com");
  grower = await signInAs("grower@example.com");
  miller = await signInAs("miller@example.com");
  brewer = await signInAs("brewer@example.com");
});

describe("a harvest the mill holds", () => {
  it("is not the grower's to zero any more: 403 with the reason, and nothing changes", async () => {
    const code = await harvest(300);
    await receiveAtMill(code, 300);
    const before = await tableDigests();
    const res = await correct(grower, registeringOf(code));
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe("This lot has moved on: only the office of the party holding it now, or the brewery office, may correct its records.");
    expect(await tableDigests()).toEqual(before);
  });

  it("the form's action answers the grower the same refusal", async () => {
    const code = await harvest(310);
    await receiveAtMill(code, 310);
    const { correctEventAction } = await import("../../app/(office)/lots/[code]/actions");
    const before = await tableDigests();
    const out = await submit(grower, correctEventAction, { code, corrects: String(registeringOf(code)), reason: "Bags counted twice" });
    expect(out).toMatchObject({ state: { fields: { corrects: ["This lot has moved on: only the office of the party holding it now, or the brewery office, may correct its records."] } } });
    expect(await tableDigests()).toEqual(before);
  });

  it("the mill holding it may correct it; the reason shows on the grower's and the mill's record of the lot", async () => {
    const code = await harvest(320);
    await receiveAtMill(code, 320);
    const registering = registeringOf(code);
    const res = await correct(miller, registering, "Scale at the farm read 20 kg heavy");
    expect(res.status).toBe(201);
    for (const cookie of [grower, miller]) {
      const items = await history(cookie, code);
      expect(items.find((e) => e.id === registering)).toMatchObject({ correctedBy: res.body.id });
      expect(items.find((e) => e.id === res.body.id)).toMatchObject({ step: "correcting", corrects: registering, reason: "Scale at the farm read 20 kg heavy", user: { name: "Ota Kenji" } });
    }
  });

  it("the brewery office may correct it too", async () => {
    const code = await harvest(330);
    await receiveAtMill(code, 330);
    expect((await correct(admin, registeringOf(code))).status).toBe(201);
  });

  it("the grower still corrects its own harvest before the hand-over", async () => {
    const code = await harvest(340);
    expect((await correct(grower, registeringOf(code))).status).toBe(201);
  });
});

describe("polished rice the brewery holds", () => {
  it("the mill may no longer reverse the polishing run; the brewery office may", async () => {
    const code = await harvest(400);
    await receiveAtMill(code, 400);
    const run = await event(miller, { step: "polishing", inputs: [{ lot: code, quantity: 400 }], outputs: [{ kind: "polished", quantity: 280 }], measurements: [{ name: "targetPolishingRatioPct", value: 70, unit: "%" }] });
    expect(run.status).toBe(201);
    const polished = run.body.outputs[0].code as string;
    await handOver(polished, 280, miller, "brewery-kirinoha", brewer);

    const before = await tableDigests();
    const refused = await correct(miller, run.body.id, "Wrong target keyed");
    expect(refused.status).toBe(403);
    expect(await tableDigests()).toEqual(before);
    expect((await correct(admin, run.body.id, "Wrong target keyed")).status).toBe(201);
  });
});

describe("a reversed delivery on the grower's account", () => {
  it("shows the reversal with its reason in the grower's ledger", async () => {
    const code = await harvest(360);
    const receipt = await receiveAtMill(code, 360);
    const res = await correct(miller, receipt, "Truck unloaded at the wrong mill bay");
    expect(res.status).toBe(201);
    const ledger = await call(getLedger, jsonRequest("/api/suppliers/grower-ikeda/ledger", { cookie: grower }), { partyId: "grower-ikeda" });
    expect(ledger.body.entries).toContainEqual(expect.objectContaining({ kind: "reversal", ref: code, reason: "Truck unloaded at the wrong mill bay" }));
  });
});
