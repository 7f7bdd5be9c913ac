import { readFileSync } from "node:fs";
import path from "node:path";
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postCommit } from "../../app/api/import/commit/route";
import { POST as postPreview } from "../../app/api/import/preview/route";
import { GET as getLotRoute } from "../../app/api/lots/[code]/route";
import { GET as getLotEvents } from "../../app/api/lots/[code]/events/route";
import { createLineCollector, MAX_IMPORT_ROWS, type ImportKind } from "@/lib/validation/csv";
import { POST as postEvent } from "../../app/api/events/route";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

let grower: string, miller: string;

/** Reads a sample file the way the browser does: papaparse without a header row, lines counted. */
function fileRows(name: string) {
  const text = readFileSync(path.resolve("fixtures/csv", name), "utf8");
  const parsed = Papa.parse<string[]>(text, { header: false, skipEmptyLines: false });
  const lines = createLineCollector();
  lines.add(parsed.data, parsed.meta.linebreak);
  return { header: lines.header!, rows: lines.rows };
}

const preview = (cookie: string, kind: ImportKind, file: string) => call(postPreview, jsonRequest("/api/import/preview", { cookie, body: { kind, ...fileRows(file) } }));
const commit = (cookie: string, kind: ImportKind, file: string, headers: Record<string, string> = {}) =>
  call(postCommit, jsonRequest("/api/import/commit", { cookie, body: { kind, ...fileRows(file) }, headers }));
const lot = async (cookie: string, code: string) => (await call(getLotRoute, jsonRequest(`/api/lots/${code}`, { cookie }), { code })).body;

beforeAll(async () => {
  grower = await signInAs("grower@example.com");
  miller = await signInAs("miller@example.com");
});

describe("harvest import", () => {
  it("reports exactly the bad row and column, and neither the preview nor the commit writes anything", async () => {
    const before = await tableDigests();
    const checked = await preview(grower, "harvests", "harvests-bad-grade.csv");
    expect(checked.status).toBe(200);
    expect(checked.body).toMatchObject({ kind: "harvests", rows: 3, committed: false });
    // Line 3 of the file holds grade "premium"; the grades are MAFF's inspection grades
    // (src/domain/grades.ts), listed as the API lists them.
    expect(checked.body.problems).toEqual([{ line: 3, code: "invalid", fields: { grade: ["Choose one of: 1, 2, 3, tokujo, tokuto, equivalent, out-of-grade."] } }]);
    const committed = await commit(grower, "harvests", "harvests-bad-grade.csv");
    expect(committed.status).toBe(422);
    expect(committed.body.error.message).toBe("1 row needs correcting; nothing was imported.");
    expect(committed.body.problems.map((p: { line: number }) => p.line)).toEqual([3]);
    expect(committed.body.created).toEqual([]);
    expect(await tableDigests()).toEqual(before);
  });

  it("refuses a row on another grower's field as an unknown field, writing nothing", async () => {
    const before = await tableDigests();
    const res = await commit(grower, "harvests", "harvests-other-growers-field.csv");
    expect(res.status).toBe(422);
    expect(res.body.problems).toEqual([{ line: 3, code: "invalid", fields: { field: ["Choose one of your fields."] } }]);
    expect(await tableDigests()).toEqual(before);
  });

  it("commits every row of a good file as lots with the file's values", async () => {
    const before = await tableDigests();
    const checked = await preview(grower, "harvests", "harvests-good.csv");
    expect(checked.body.problems).toEqual([]);
    expect(await tableDigests()).toEqual(before);

    const res = await commit(grower, "harvests", "harvests-good.csv");
    expect(res.status).toBe(201);
    expect(res.body.committed).toBe(true);
    // The demo season is 2026; these lots are dated 2025, and the dry runs above gave
    // their lot numbers back, so the first commit starts the 2025 series at 0001.
    expect(res.body.created.slice(0, 3)).toEqual([
      { line: 2, code: "H25-0001" },
      { line: 3, code: "H25-0002" },
      { line: 4, code: "H25-0003" },
    ]);
    expect(res.body.created[3].line).toBe(5);
    const [a, b, c, d] = await Promise.all(res.body.created.map((x: { code: string }) => lot(grower, x.code)));
    // A day in the file is noon in Japan (UTC+09:00, no daylight saving: Japan's Standard Time).
    expect(a).toMatchObject({ kind: "harvest", quantity: 600, onHand: 600, variety: "Yamada Nishiki", cropYear: 2025, grade: "1", moisturePct: 14.8, field: { id: "field-ikeda-terrace" }, attributes: { bags: 10 }, createdAt: "2025-09-28T03:00:00.000Z" });
    expect(b).toMatchObject({ quantity: 480.5, variety: "Omachi", grade: "tokuto", moisturePct: 15, field: { id: "field-ikeda-cedar", name: "Cedar Bend" }, attributes: { bags: 8 } });
    // MAFF: above 15.0 % moisture brown rice takes no grade, so out-of-grade is the one accepted.
    expect(c).toMatchObject({ quantity: 240, grade: "out-of-grade", moisturePct: 16.2, field: { id: "field-ikeda-cedar" } });
    expect(d).toMatchObject({ quantity: 120, grade: "tokujo", field: { id: "field-ikeda-terrace" }, party: { id: "grower-ikeda" } });
  });

  it("answers the same commit once for one Idempotency-Key", async () => {
    const headers = { "idempotency-key": "import-4d1c" };
    const first = await commit(grower, "harvests", "harvests-good.csv", headers);
    const before = await tableDigests();
    const again = await commit(grower, "harvests", "harvests-good.csv", headers);
    expect(again.status).toBe(201);
    expect(again.body).toEqual(first.body);
    expect(await tableDigests()).toEqual(before);
  });

  it("refuses the import to roles that record no harvests, and files without the columns", async () => {
    expect((await preview(miller, "harvests", "harvests-good.csv")).status).toBe(403);
    const { rows } = fileRows("harvests-good.csv");
    const res = await call(postPreview, jsonRequest("/api/import/preview", { cookie: grower, body: { kind: "harvests", header: ["field", "variety", "cropYear", "brownKg", "moisture", "grade", "bags"], rows } }));
    expect(res.status).toBe(422);
    expect(res.body.error.fields.header).toEqual(['Unknown column "moisture".', "Missing columns: moisturePct."]);
    const many = Array.from({ length: MAX_IMPORT_ROWS + 1 }, (_, i) => ({ line: i + 2, cells: rows[0]!.cells }));
    const tooMany = await call(postPreview, jsonRequest("/api/import/preview", { cookie: grower, body: { kind: "harvests", header: fileRows("harvests-good.csv").header, rows: many } }));
    expect(tooMany.status).toBe(422);
    expect(tooMany.body.error.fields.rows).toBeDefined();
  });
});

describe("receipt import", () => {
  // Each receipt answers the grower's dispatch of the lot to the mill (a receipt needs the sender's word).
  beforeAll(async () => {
    for (const code of ["H25-0001", "H25-0002", "H25-0003"]) {
      const onHand = (await lot(grower, code)).onHand;
      const sent = await call(postEvent, jsonRequest("/api/events", { cookie: grower, body: { step: "shipping", at: "2025-10-01T09:00:00+09:00", inputs: [{ lot: code, quantity: onHand }], counterpartyId: "mill-shirotae", referenceDoc: `DS-${code}` } }));
      expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    }
  });

  it("fails the second receipt of the same lot in one file, at its line, and writes nothing", async () => {
    const before = await tableDigests();
    const checked = await preview(miller, "receipts", "receipts-same-lot-twice.csv");
    // Line 3 is blank; the second receipt sits on line 4 and sees the first one's move.
    expect(checked.body.problems).toEqual([{ line: 4, code: "conflict", fields: { lot: ["Lot H25-0003 is already held by your party."] } }]);
    const res = await commit(miller, "receipts", "receipts-same-lot-twice.csv");
    expect(res.status).toBe(422);
    expect(await tableDigests()).toEqual(before);
    expect((await lot(grower, "H25-0003")).party.id).toBe("grower-ikeda");
  });

  it("records each receipt, naming the sender by id or by name", async () => {
    const res = await commit(miller, "receipts", "receipts-good.csv");
    expect(res.status).toBe(201);
    // The first receipt's place is quoted over two lines, so the second receipt starts on line 4.
    expect(res.body.created).toEqual([{ line: 2, code: "H25-0001" }, { line: 4, code: "H25-0002" }]);
    expect((await lot(miller, "H25-0001")).party.id).toBe("mill-shirotae");
    expect((await lot(miller, "H25-0002")).party.id).toBe("mill-shirotae");
    const events = (await call(getLotEvents, jsonRequest("/api/lots/H25-0001/events", { cookie: miller }), { code: "H25-0001" })).body.items;
    expect(events.map((e: { step: string }) => e.step)).toEqual(["registering", "shipping", "receiving"]);
    expect(events[2]).toMatchObject({ referenceDoc: "DS-1001", place: "Shirotae Polishing Works\r\nMill Road 5, Asagiri Valley", at: "2025-10-02T03:00:00.000Z" });
  });

  it("is not open to growers", async () => {
    expect((await preview(grower, "receipts", "receipts-good.csv")).status).toBe(403);
  });
});
