import { describe, expect, it } from "vitest";
import { insertInChunks } from "./batch";

// SQLite's default SQLITE_MAX_VARIABLE_NUMBER is 32,766 (sqlite.org/limits.html, §9).
describe("inserting many rows", () => {
  it("slices rows so no statement binds more than 1,000 rows", () => {
    const slices: number[] = [];
    insertInChunks(Array.from({ length: 8_192 }, (_, i) => i), (rows) => slices.push(rows.length));
    expect(slices).toEqual([1000, 1000, 1000, 1000, 1000, 1000, 1000, 1000, 192]);
    expect(slices.reduce((a, b) => a + b, 0)).toBe(8_192);
  });
});
