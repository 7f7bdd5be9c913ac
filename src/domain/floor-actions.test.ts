import { describe, expect, it } from "vitest";
import { actionsFor, daysSince } from "./floor-actions";

describe("floor actions by stage (the order of work on a brewery floor, common practice)", () => {
  it("follows the rice from polished to bottle", () => {
    expect(actionsFor("polished")).toEqual(["soak"]);
    expect(actionsFor("soaked")).toEqual(["steam"]);
    expect(actionsFor("steamed", { use: "koji" })).toEqual(["koji-check", "koji"]);
    expect(actionsFor("steamed", { use: "mash" })).toEqual(["add"]);
    expect(actionsFor("tank")).toContain("press");
    expect(actionsFor("sake")).toContain("bottle");
    expect(actionsFor("bottled")).toEqual([]);
    expect(actionsFor("harvest")).toEqual([]);
  });

  it("counts whole days rested", () => {
    expect(daysSince("2026-11-01T10:00:00+09:00", new Date("2026-11-15T09:00:00+09:00"))).toBe(13);
  });
});
