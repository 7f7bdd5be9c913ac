import { describe, expect, it } from "vitest";
import { digitalLinkUri, gtinCheckDigit, isValidGtin, toGtin14 } from "./gtin";

describe("GS1 check digit (General Specifications §7.9, mod 10)", () => {
  it("computes the check digit of GS1's Digital Link example GTIN 09506000134352", () => {
    // The GTIN used throughout the GS1 Digital Link standard's examples; worked by hand:
    // weighted sum 78 → (10 − 8) mod 10 = 2.
    expect(gtinCheckDigit("0950600013435")).toBe(2);
    expect(isValidGtin("09506000134352")).toBe(true);
    expect(isValidGtin("09506000134353")).toBe(false);
  });

  it("handles GTIN-13, GTIN-12 and GTIN-8 lengths", () => {
    // EAN-13 4006381333931 is a long-standing worked example of the mod-10 rule (from memory).
    expect(isValidGtin("4006381333931")).toBe(true);
    // UPC-A 036000291452 (a common textbook example, from memory): check digit 2.
    expect(gtinCheckDigit("03600029145")).toBe(2);
    // GTIN-8 96385074 (from memory): check digit 4.
    expect(isValidGtin("96385074")).toBe(true);
  });

  it("refuses lengths and characters GS1 does not define", () => {
    expect(isValidGtin("123456789")).toBe(false);
    expect(isValidGtin("0950600013435X")).toBe(false);
    expect(() => toGtin14("4006381333932")).toThrow(RangeError);
  });
});

describe("GS1 Digital Link URI", () => {
  it("pads to GTIN-14 and percent-encodes the lot (AI 10)", () => {
    expect(digitalLinkUri("https://kirinoha.example/", "4006381333931", "BT26-0001")).toBe("https://kirinoha.example/01/04006381333931/10/BT26-0001");
    expect(digitalLinkUri("https://id.example", "09506000134352", "A/B 1")).toBe("https://id.example/01/09506000134352/10/A%2FB%201");
  });
});
