import { describe, expect, it } from "vitest";
import { dayIn, daysShown, formatDay, formatDayTime, hourOfDayIn, isTimeZone, nextDay, startOfDayIn } from "./dates";

// Offsets from the IANA tz database: Asia/Tokyo is UTC+9 with no DST; Europe/London is UTC+0
// in winter and UTC+1 (BST) from the last Sunday of March to the last Sunday of October
// (2026: 29 March and 25 October); America/New_York UTC−5/−4, DST from 8 March 2026.
describe("dates in the brewery's time zone", () => {
  const event = new Date("2026-10-02T22:30:00Z");

  it("an event late on 2 October UTC is 3 October in Tokyo and 2 October in London", () => {
    expect(formatDay(event, "ja", "Asia/Tokyo")).toBe("2026/10/03");
    expect(formatDay(event, "ja", "Europe/London")).toBe("2026/10/02");
    expect(formatDay(event, "en", "Asia/Tokyo")).toBe("Oct 3, 2026");
    expect(dayIn(event, "Asia/Tokyo")).toBe("2026-10-03");
    expect(dayIn(event, "Europe/London")).toBe("2026-10-02");
  });

  it("day and time on a 24-hour clock", () => {
    const at = new Date("2026-10-03T05:05:00Z");
    expect(formatDayTime(at, "ja", "Asia/Tokyo")).toBe("2026/10/03 14:05");
    expect(formatDayTime(at, "en", "Asia/Tokyo")).toBe("Oct 3, 2026, 14:05");
    expect(formatDayTime(at, "ja", "Europe/London")).toBe("2026/10/03 06:05");
  });

  it("a bare calendar day is never moved by the zone", () => {
    expect(formatDay("2026-10-03", "ja", "America/New_York")).toBe("2026/10/03");
    expect(formatDay("2026-10-03", "en", "Pacific/Kiritimati")).toBe("Oct 3, 2026");
  });

  it("the start of a day in a zone, DST included", () => {
    expect(startOfDayIn("2026-10-03", "Asia/Tokyo").toISOString()).toBe("2026-10-02T15:00:00.000Z");
    expect(startOfDayIn("2026-07-01", "Europe/London").toISOString()).toBe("2026-06-30T23:00:00.000Z");
    expect(startOfDayIn("2026-12-01", "Europe/London").toISOString()).toBe("2026-12-01T00:00:00.000Z");
    expect(startOfDayIn("2026-03-08", "America/New_York").toISOString()).toBe("2026-03-08T05:00:00.000Z");
    expect(startOfDayIn("2026-03-09", "America/New_York").toISOString()).toBe("2026-03-09T04:00:00.000Z");
  });

  it("zone names are checked against the runtime's IANA list", () => {
    expect(isTimeZone("Asia/Tokyo")).toBe(true);
    expect(isTimeZone("Europe/London")).toBe(true);
    expect(isTimeZone("Asia/Osaka")).toBe(false);
    expect(isTimeZone("JST")).toBe(false);
    expect(isTimeZone("")).toBe(false);
  });
});

describe("key dates shown as days", () => {
  it("lists each day once, on the zone's clock, in order: two instants of 3 October in Tokyo are one day", () => {
    // 2026-10-02T22:30Z and 2026-10-03T08:00Z are both 3 October in Tokyo (UTC+9), two days in London.
    const isos = ["2026-10-03T08:00:00.000Z", "2026-10-02T22:30:00.000Z", "2026-10-05T01:00:00.000Z"];
    expect(daysShown(isos, "Asia/Tokyo")).toEqual({ days: ["2026-10-02T22:30:00.000Z", "2026-10-05T01:00:00.000Z"] });
    expect(daysShown(isos, "Europe/London")).toEqual({ days: ["2026-10-02T22:30:00.000Z", "2026-10-03T08:00:00.000Z", "2026-10-05T01:00:00.000Z"] });
  });

  it("past eight days, the first and last day and how many days", () => {
    // One addition a day at 09:00 Tokyo time from 1 to 12 October, and a second on 1 October.
    const isos = Array.from({ length: 12 }, (_, n) => new Date(Date.UTC(2026, 9, n + 1, 0)).toISOString());
    isos.push("2026-10-01T05:00:00.000Z");
    expect(daysShown(isos, "Asia/Tokyo")).toEqual({ first: "2026-10-01T00:00:00.000Z", last: "2026-10-12T00:00:00.000Z", count: 12 });
    expect(daysShown(isos.slice(0, 8), "Asia/Tokyo")).toEqual({ days: isos.slice(0, 8) });
    expect(daysShown([], "Asia/Tokyo")).toEqual({ days: [] });
  });
});

describe("an hour of a typed day on the brewery's clock", () => {
  // IANA offsets: Tokyo UTC+9; New York UTC−4 (EDT) in October 2026.
  it("stays on that day in its own zone", () => {
    expect(hourOfDayIn("2026-10-03", 12, "Asia/Tokyo")).toBe("2026-10-03T03:00:00.000Z");
    expect(hourOfDayIn("2026-10-03", 12, "America/New_York")).toBe("2026-10-03T16:00:00.000Z");
    expect(dayIn(new Date(hourOfDayIn("2026-10-03", 9, "America/New_York")), "America/New_York")).toBe("2026-10-03");
    expect(nextDay("2026-12-31")).toBe("2027-01-01");
    expect(nextDay("2028-02-28")).toBe("2028-02-29");
  });
});
