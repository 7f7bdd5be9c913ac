import { describe, expect, it } from "vitest";
import { divideRounded, gramsOf } from "./money";

// Rounding rules as the NTA's qualified invoice Q&A names them (切捨て down, 切上げ up,
// 四捨五入 half-up) — from memory; the arithmetic below is worked by hand.
describe("divideRounded", () => {
  it("rounds 10 ÷ 3 down, up and half-up", () => {
    expect(divideRounded(10, 3, "down")).toBe(3);
    expect(divideRounded(10, 3, "up")).toBe(4);
    expect(divideRounded(10, 3, "half-up")).toBe(3);
  });

  it("takes half a yen up under half-up, and leaves exact quotients alone", () => {
    expect(divideRounded(5, 2, "half-up")).toBe(3);
    expect(divideRounded(5, 2, "down")).toBe(2);
    expect(divideRounded(12, 3, "up")).toBe(4);
  });

  it("rounds the magnitude, so a negative amount mirrors the positive one", () => {
    expect(divideRounded(-10, 3, "down")).toBe(-3);
    expect(divideRounded(-5, 2, "half-up")).toBe(-3);
    expect(divideRounded(-10, 3, "up")).toBe(-4);
  });

  it("stays exact where floats would not: 0.1 + 0.2 style traps do not reach it", () => {
    // 1,215,713 yen at 8 %: 97,257.04 yen of tax.
    expect(divideRounded(1_215_713 * 8, 100, "down")).toBe(97_257);
    expect(divideRounded(1_215_713 * 8, 100, "up")).toBe(97_258);
    expect(divideRounded(2 ** 52 + 1, 1, "down")).toBe(2 ** 52 + 1);
  });

  it("refuses fractions and a zero denominator", () => {
    expect(() => divideRounded(1.5, 1, "down")).toThrow(RangeError);
    expect(() => divideRounded(1, 0, "down")).toThrow(RangeError);
  });
});

describe("gramsOf", () => {
  it("keeps weights to the gram", () => {
    expect(gramsOf(1000.5)).toBe(1_000_500);
    expect(gramsOf(0.1 + 0.2)).toBe(300);
    expect(() => gramsOf(-1)).toThrow(RangeError);
  });
});
