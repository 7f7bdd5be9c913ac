import { describe, expect, it } from "vitest";
import { isGs1Cset82, isValidLotCode, normaliseLotCode } from "./lot-code";

// GS1 General Specifications, section 7.11, figure 7.11-1 "GS1 AI encodable character
// set 82"; AI (10) BATCH/LOT is X..20 (format from section 3.4.4). The character list is
// from memory of that figure: printable ASCII less space # $ @ [ \ ] ^ ` { | } ~.
describe("lot codes as GS1 batch/lot values", () => {
  it("accepts Grainline codes", () => {
    expect(isValidLotCode("H26-0007")).toBe(true);
    expect(isValidLotCode("PB26-12345678")).toBe(true);
  });

  it("refuses codes GS1 AI 10 cannot carry", () => {
    expect(isValidLotCode("H26 0007")).toBe(false); // space is not in set 82
    expect(isValidLotCode("H26-０００７")).toBe(false); // full-width digits
    expect(isValidLotCode("H26-00071234567890123")).toBe(false); // 21 characters
  });

  it("knows set 82 from the figure", () => {
    expect(isGs1Cset82("!\"%&'()*+,-./:;<=>?_")).toBe(true);
    expect(isGs1Cset82("#")).toBe(false);
    expect(isGs1Cset82("$")).toBe(false);
    expect(isGs1Cset82("@")).toBe(false);
    expect(isGs1Cset82("é")).toBe(false);
  });

  it("normalises typed input", () => {
    expect(normaliseLotCode("  h26-0007 ")).toBe("H26-0007");
  });
});
