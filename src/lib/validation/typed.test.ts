import { describe, expect, it } from "vitest";
import { z } from "zod";
import { optionalTypedDate, optionalTypedNumber, typedDate, typedNumber } from "./typed";

const messages = (schema: z.ZodType, value: unknown) => {
  const r = schema.safeParse(value);
  return r.success ? [] : r.error.issues.map((i) => i.message);
};

describe("typed zod helpers", () => {
  it("read typed text, pass numbers through, and hold the bounds", () => {
    const kg = typedNumber(0, 100_000);
    expect(kg.parse("1,260")).toBe(1260);
    expect(kg.parse("１，２６０")).toBe(1260);
    expect(kg.parse(1260)).toBe(1260);
    expect(messages(kg, "1,26")).toEqual(["validation.number"]);
    expect(messages(kg, "")).toEqual(["validation.required"]);
    expect(messages(kg, undefined)).toEqual(["validation.required"]);
    expect(kg.safeParse("100,001").success).toBe(false);
    expect(kg.safeParse("-1").success).toBe(false);
  });

  it("whole numbers and blank optional boxes", () => {
    const count = typedNumber(1, 1000, { int: true });
    expect(count.parse("８００")).toBe(800);
    expect(messages(count, "2.5")).toEqual(["validation.wholeNumber"]);
    const lat = optionalTypedNumber(-90, 90);
    expect(lat.parse("")).toBeUndefined();
    expect(lat.parse("３５.６")).toBe(35.6);
  });

  it("dates typed in any accepted form become YYYY-MM-DD", () => {
    expect(typedDate().parse("２０２６／１０／０３")).toBe("2026-10-03");
    expect(typedDate().parse("2026年10月3日")).toBe("2026-10-03");
    expect(messages(typedDate(), "2026/02/30")).toEqual(["validation.date"]);
    expect(messages(typedDate(), "")).toEqual(["validation.required"]);
    expect(optionalTypedDate().parse("")).toBeUndefined();
  });
});

describe("bounds keep zod's own issue codes", () => {
  it("too big and too small are worded by field-errors, not as 'enter a number'", () => {
    const pct = typedNumber(0, 60);
    const issue = pct.safeParse("61").error?.issues[0];
    expect(issue).toMatchObject({ code: "too_big", maximum: 60 });
    expect(pct.safeParse("-1").error?.issues[0]).toMatchObject({ code: "too_small", minimum: 0 });
  });
});
