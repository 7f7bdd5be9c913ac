import { readFileSync } from "node:fs";
import path from "node:path";
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postCommit } from "../../app/api/import/commit/route";
import { POST as postPreview } from "../../app/api/import/preview/route";
import { GET as getLotRoute } from "../../app/api/lots/[code]/route";
import { decodeCsvBytes } from "@/lib/csv-encoding";
import { createLineCollector } from "@/lib/validation/csv";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

let grower: string;
const english = { "accept-language": "en" };

/** A file as the import page reads it: bytes decoded (the fixture was written by Debian's iconv as CP932), then papaparse. */
function fileRows(name: string) {
  const decoded = decodeCsvBytes(new Uint8Array(readFileSync(path.resolve("fixtures/csv", name))));
  if (!decoded.ok) throw new Error(`${name}: ${decoded.reason}`);
  const parsed = Papa.parse<string[]>(decoded.text, { header: false, skipEmptyLines: false });
  const lines = createLineCollector();
  lines.add(parsed.data, parsed.meta.linebreak);
  return { encoding: decoded.encoding, body: { kind: "harvests", header: lines.header!, rows: lines.rows } };
}
const lot = async (code: string) => (await call(getLotRoute, jsonRequest(`/api/lots/${code}`, { cookie: grower }), { code })).body;

beforeAll(async () => {
  grower = await signInAs("grower@example.com");
});

describe("a Shift_JIS harvest file with numbers and days as a spreadsheet holds them", () => {
  it("reads 1,260 (quoted, RFC 4180), full-width digits, 2024/10/03, 2024-9-30 and 2024年10月1日", async () => {
    const { encoding, body } = fileRows("harvests-typed-shift-jis.csv");
    expect(encoding).toBe("Shift_JIS");
    const checked = await call(postPreview, jsonRequest("/api/import/preview", { cookie: grower, body, headers: english }));
    expect(checked.body.problems).toEqual([]);
    const res = await call(postCommit, jsonRequest("/api/import/commit", { cookie: grower, body, headers: english }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const [a, b, c] = await Promise.all(res.body.created.map((x: { code: string }) => lot(x.code)));
    // A day in the file is noon in Japan (UTC+09:00): 03:00 UTC the same day.
    expect(a).toMatchObject({ quantity: 1260, cropYear: 2024, moisturePct: 14.8, attributes: { bags: 21 }, createdAt: "2024-10-03T03:00:00.000Z" });
    expect(b).toMatchObject({ quantity: 2400.5, grade: "tokujo", attributes: { bags: 1000 }, createdAt: "2024-09-30T03:00:00.000Z" });
    expect(c).toMatchObject({ quantity: 480, createdAt: "2024-10-01T03:00:00.000Z" });
  });

  it("still refuses what is not a number or a day, naming the cell, and writes nothing", async () => {
    const { body } = fileRows("harvests-typed-shift-jis.csv");
    body.rows[0]!.cells[3] = "1,26";
    body.rows[1]!.cells[7] = "2024/02/30";
    const before = await tableDigests();
    const res = await call(postCommit, jsonRequest("/api/import/commit", { cookie: grower, body, headers: english }));
    expect(res.status).toBe(422);
    expect(res.body.problems).toEqual([
      { line: 2, code: "invalid", fields: { brownKg: ["Write a number, such as 14.8 or 1,260."] } },
      { line: 3, code: "invalid", fields: { harvestedOn: ["Write the date as 2026/10/03 or 2026-10-03."] } },
    ]);
    expect(await tableDigests()).toEqual(before);
  });
});
