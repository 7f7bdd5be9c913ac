import { describe, expect, it } from "vitest";
import { readSearchTerms } from "./search-terms";

describe("readSearchTerms: lot codes with or without the hyphen", () => {
  it("reads H260007 and h26 0007 as H26-0007 (src/domain/lot-code.ts: letter, year, hyphen, sequence)", () => {
    expect(readSearchTerms("H260007").lotCode).toBe("H26-0007");
    expect(readSearchTerms(" h26 0007 ").lotCode).toBe("H26-0007");
    expect(readSearchTerms("BT26-0001").lotCode).toBe("BT26-0001");
    expect(readSearchTerms("H26-0007").compactCode).toBe("H260007");
  });
  it("reads full-width digits typed on a Japanese keyboard the same (NFKC)", () => {
    expect(readSearchTerms("Ｈ２６０００７").lotCode).toBe("H26-0007");
  });
  it("keeps a part of a code for a partial match, and nothing for a name", () => {
    expect(readSearchTerms("0007")).toMatchObject({ lotCode: null, compactCode: "0007" });
    expect(readSearchTerms("Yamada Nishiki")).toMatchObject({ lotCode: null, compactCode: null, gtin14: null });
  });
});

describe("readSearchTerms: GTIN/JAN (GS1 General Specifications)", () => {
  // 9506000134352: GS1's Digital Link example GTIN (GTIN-14 09506000134352), check digit 2 by §7.9.
  it("reads a JAN-13 as the GTIN-14 with a leading 0, and the GTIN-14 as itself", () => {
    expect(readSearchTerms("9506000134352").gtin14).toBe("09506000134352");
    expect(readSearchTerms("09506000134352").gtin14).toBe("09506000134352");
    expect(readSearchTerms("9 506000 134352").gtin14).toBe("09506000134352");
  });
  it("refuses a wrong check digit: no GTIN is searched for", () => {
    expect(readSearchTerms("9506000134353").gtin14).toBeNull();
  });
});
