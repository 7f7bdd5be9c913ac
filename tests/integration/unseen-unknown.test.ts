// Same answer for unseen and unknown (issue 12, item 4; DEVELOPERS.md "the visibility rule"):
// a field, an event or a supplier the reader may not see answers exactly as an id that does
// not exist — same status, same code, same message, byte for byte — and changes nothing.
import { beforeAll, describe, expect, it, vi } from "vitest";
import { POST as postEvent } from "../../app/api/events/route";
import { POST as postHarvest } from "../../app/api/harvests/route";
import { GET as getLedger } from "../../app/api/suppliers/[partyId]/ledger/route";
import { GET as getStatements } from "../../app/api/suppliers/[partyId]/statements/route";
import { GET as getStatementCsv } from "../../app/api/suppliers/[partyId]/statements/[number]/statement.csv/route";
import { GET as getStatementPdf } from "../../app/api/suppliers/[partyId]/statements/[number]/statement.pdf/route";
import { GET as getListCsv } from "../../app/api/suppliers/[partyId]/list.csv/route";
import { getSqlite } from "@/server/platform/db";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";
import { submit } from "../support/action-scope";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const cookies: Record<string, string> = {};
const raw = async (response: Promise<Response>) => {
  const r = await response;
  return { status: r.status, text: await r.text() };
};
const params = (p: Record<string, string>) => ({ params: Promise.resolve(p) });

beforeAll(async () => {
  for (const who of ["admin", "grower", "grower2", "miller", "brewer"]) cookies[who] = await signInAs(`${who}@example.com`);
});

describe("fields", () => {
  const harvest = (cookie: string, fieldId: string) =>
    raw(postHarvest(jsonRequest("/api/harvests", { cookie, body: { fieldId, variety: "Omachi", cropYear: 2026, brownKg: 500, moisturePct: 14.6, grade: "2", bags: 8 } })));

  it("POST /api/harvests: another grower's field answers as a field that does not exist", async () => {
    const before = await tableDigests();
    const unseen = await harvest(cookies.grower!, "field-nakase-river");
    const unknown = await harvest(cookies.grower!, "field-no-such-paddy");
    expect(unknown.status).toBe(422);
    expect(unseen).toEqual(unknown);
    expect(await tableDigests()).toEqual(before);
  });

  it("the harvest form's action answers both alike", async () => {
    const { registerHarvestAction } = await import("../../app/(office)/fields/actions");
    const form = (fieldId: string) => ({ fieldId, variety: "Omachi", cropYear: "2026", brownKg: "500", moisturePct: "14.6", grade: "2", bags: "8" });
    const before = await tableDigests();
    const unseen = await submit(cookies.grower!, registerHarvestAction, form("field-nakase-river"));
    const unknown = await submit(cookies.grower!, registerHarvestAction, form("field-no-such-paddy"));
    expect(unknown).toMatchObject({ state: { fields: { fieldId: ["Choose one of your fields."] } } });
    expect(JSON.stringify(unseen).replace("field-nakase-river", "")).toBe(JSON.stringify(unknown).replace("field-no-such-paddy", ""));
    expect(await tableDigests()).toEqual(before);
  });

  it("POST /api/fields: a grower naming another grower answers as naming no grower", async () => {
    const { POST } = await import("../../app/api/fields/route");
    const field = (growerId: string) => raw(POST(jsonRequest("/api/fields", { cookie: cookies.grower, body: { name: "Probe Paddy", region: "Hyogo", areaHa: 1, growerId } })));
    expect(await field("grower-nakase")).toEqual(await field("grower-no-such-farm"));
  });
});

describe("events to correct", () => {
  let theirs = 0;
  beforeAll(async () => {
    // A harvest of Ikeda Farm's still at the farm: Nakase Family Paddies may not see it or its events.
    const made = await call(postHarvest, jsonRequest("/api/harvests", { cookie: cookies.grower, body: { fieldId: "field-ikeda-cedar", variety: "Yamada Nishiki", cropYear: 2026, brownKg: 210, moisturePct: 14.7, grade: "1", bags: 4 } }));
    theirs = (getSqlite().prepare("select e.id from events e join event_outputs o on o.event_id = e.id join lots l on l.id = o.lot_id where l.code = ?").get(made.body.code) as { id: number }).id;
  });
  const correcting = (cookie: string, corrects: number) => raw(postEvent(jsonRequest("/api/events", { cookie, body: { step: "correcting", corrects, reason: "Probe: wrong bag" } })));

  it("POST /api/events: another party's event answers as an event id that does not exist", async () => {
    const before = await tableDigests();
    const unseen = await correcting(cookies.grower2!, theirs);
    const unknown = await correcting(cookies.grower2!, 9_999_999);
    expect(unknown.status).toBe(422);
    expect(unseen).toEqual(unknown);
    // The mill neither holds nor made the lot: the same for it.
    expect(await correcting(cookies.miller!, theirs)).toEqual(await correcting(cookies.miller!, 9_999_999));
    expect(await tableDigests()).toEqual(before);
  });

  it("the correction form's action answers both alike", async () => {
    const { correctEventAction } = await import("../../app/(office)/lots/[code]/actions");
    const before = await tableDigests();
    const unseen = await submit(cookies.grower2!, correctEventAction, { code: "H26-0001", corrects: String(theirs), reason: "Probe: wrong bag" });
    const unknown = await submit(cookies.grower2!, correctEventAction, { code: "H26-0001", corrects: "9999999", reason: "Probe: wrong bag" });
    expect(unknown).toMatchObject({ state: { fields: { corrects: ["This event cannot be corrected."] } } });
    expect(JSON.stringify(unseen).replace(String(theirs), "")).toBe(JSON.stringify(unknown).replace("9999999", ""));
    expect(await tableDigests()).toEqual(before);
  });
});

describe("suppliers", () => {
  const ledger = (cookie: string, partyId: string) => raw(getLedger(jsonRequest(`/api/suppliers/${partyId}/ledger`, { cookie }), params({ partyId })));
  const statements = (cookie: string, partyId: string) => raw(getStatements(jsonRequest(`/api/suppliers/${partyId}/statements`, { cookie }), params({ partyId })));
  const file = (route: typeof getStatementCsv, cookie: string, partyId: string, number: string) =>
    raw(route(jsonRequest(`/api/suppliers/${partyId}/statements/${number}/statement`, { cookie }), params({ partyId, number })));

  it("GET …/ledger: another supplier's account answers as a party that does not exist (404)", async () => {
    const unknownToOffice = await ledger(cookies.admin!, "no-such-party");
    expect(unknownToOffice.status).toBe(404);
    for (const who of ["grower", "grower2", "miller"]) {
      const other = who === "grower" ? "grower-nakase" : "grower-ikeda";
      expect(await ledger(cookies[who]!, other), who).toEqual(unknownToOffice);
      expect(await ledger(cookies[who]!, "no-such-party"), who).toEqual(unknownToOffice);
    }
  });

  it("GET …/list.csv: another supplier's deliveries answer as a party that does not exist", async () => {
    const list = (cookie: string, partyId: string) => raw(getListCsv(jsonRequest(`/api/suppliers/${partyId}/list.csv`, { cookie }), params({ partyId })));
    const unknown = await list(cookies.admin!, "no-such-party");
    expect(unknown.status).toBe(404);
    expect((await list(cookies.admin!, "grower-ikeda")).status).toBe(200);
    expect(await list(cookies.grower2!, "grower-ikeda")).toEqual(unknown);
    expect(await list(cookies.miller!, "grower-ikeda")).toEqual(unknown);
    expect(await list(cookies.grower2!, "no-such-party")).toEqual(unknown);
  });

  it("GET …/statements and a statement's PDF and CSV: the same", async () => {
    const unknownList = await statements(cookies.admin!, "no-such-party");
    expect(unknownList.status).toBe(404);
    expect(await statements(cookies.grower2!, "grower-ikeda")).toEqual(unknownList);
    expect(await statements(cookies.grower2!, "no-such-party")).toEqual(unknownList);
    // S-2025-0001 is Ikeda Farm's seeded statement (src/server/records/seed-suppliers.ts).
    for (const route of [getStatementCsv, getStatementPdf]) {
      const unseen = await file(route, cookies.grower2!, "grower-ikeda", "S-2025-0001");
      expect(unseen.status).toBe(404);
      expect(unseen).toEqual(await file(route, cookies.grower2!, "no-such-party", "S-2025-0001"));
    }
  });

  it("a role that reads no supplier's money keeps 403", async () => {
    expect((await ledger(cookies.brewer!, "grower-ikeda")).status).toBe(403);
    expect(await ledger(cookies.brewer!, "grower-ikeda")).toEqual(await ledger(cookies.brewer!, "no-such-party"));
  });
});
