import { describe, expect, it } from "vitest";
import { ageBalance, ageInDays, bucketOf } from "./ageing";

// 30-day ageing buckets and oldest-first settlement: common practice in accounts payable.
// Days are counted as calendar days in Japan (UTC+9); the dates are worked by hand.
const asOf = new Date("2026-12-02T09:00:00+09:00");

describe("ageing of a supplier's balance", () => {
  it("puts the edges of each bucket where they belong", () => {
    expect([0, 30, 31, 60, 61, 90, 91].map(bucketOf)).toEqual(["days0to30", "days0to30", "days31to60", "days31to60", "days61to90", "days61to90", "over90"]);
  });

  it("counts calendar days in Japan, not 24-hour spans in UTC", () => {
    // 00:30 on 2 November in Japan is still 1 November in UTC: 30 days before 2 December.
    expect(ageInDays(new Date("2026-11-01T15:30:00Z"), asOf)).toBe(30);
    expect(ageInDays(new Date("2026-11-01T14:30:00Z"), asOf)).toBe(31);
    expect(ageInDays(new Date("2027-01-01T00:00:00+09:00"), asOf)).toBe(0);
  });

  it("lays the balance over the newest charges: older ones count as paid first", () => {
    const charges = [
      { at: new Date("2026-09-01T10:00:00+09:00"), amountYen: 50_000 }, // 92 days
      { at: new Date("2026-10-15T10:00:00+09:00"), amountYen: 200_000 }, // 48 days
      { at: new Date("2026-11-20T10:00:00+09:00"), amountYen: 100_000 }, // 12 days
    ];
    expect(ageBalance(charges, 260_000, asOf)).toEqual({ days0to30: 100_000, days31to60: 160_000, days61to90: 0, over90: 0 });
    expect(ageBalance(charges, 350_000, asOf)).toEqual({ days0to30: 100_000, days31to60: 200_000, days61to90: 0, over90: 50_000 });
  });

  it("shows nothing owed for a settled or overpaid account", () => {
    const charges = [{ at: new Date("2026-11-20T10:00:00+09:00"), amountYen: 100_000 }];
    expect(ageBalance(charges, 0, asOf)).toEqual({ days0to30: 0, days31to60: 0, days61to90: 0, over90: 0 });
    expect(ageBalance(charges, -500, asOf)).toEqual({ days0to30: 0, days31to60: 0, days61to90: 0, over90: 0 });
  });

  it("counts calendar days on the brewery's clock when it is set elsewhere", () => {
    // 20:00 UTC on 2 Oct is 3 Oct in Tokyo (UTC+9) and still 2 Oct in London (UTC+1 in
    // October, BST): IANA tz database offsets. To 2 Nov (noon UTC) that is 30 days in Tokyo, 31 in London.
    const at = new Date("2026-10-02T20:00:00Z");
    const asOfNov = new Date("2026-11-02T12:00:00Z");
    expect(ageInDays(at, asOfNov, "Asia/Tokyo")).toBe(30);
    expect(ageInDays(at, asOfNov, "Europe/London")).toBe(31);
    expect(ageBalance([{ at, amountYen: 1_000 }], 1_000, asOfNov, "Europe/London")).toEqual({ days0to30: 0, days31to60: 1_000, days61to90: 0, over90: 0 });
  });
});
