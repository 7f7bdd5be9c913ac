import { describe, expect, it } from "vitest";
import { digitalLinkUri } from "@/domain/gtin";
import { labelPageUrl, lotPageUrl } from "@/domain/label-url";
import { lotCodeFromScan, readScanText } from "./scan-text";

// 09506000134352 and 09521234543213: GTINs used in GS1's Digital Link examples.
const GS1_EXAMPLE_GTIN = "09506000134352";

describe("our lot label address", () => {
  it("reads the code from {origin}/lots/{CODE}, as the label route prints it", () => {
    expect(readScanText(lotPageUrl("https://grainline.kirinoha.example", "P26-0003"))).toEqual({ code: "P26-0003", source: "label" });
    expect(readScanText("http://localhost:3000/lots/H26-0007/")).toEqual({ code: "H26-0007", source: "label" });
  });

  it("reads the label route {origin}/l/{CODE} that labels now carry", () => {
    expect(readScanText(labelPageUrl("https://grainline.kirinoha.example", "P26-0003"))).toEqual({ code: "P26-0003", source: "label" });
    expect(lotCodeFromScan("HTTPS://GRAINLINE.EXAMPLE/L/P26-0001")).toBe("P26-0001");
  });

  it("reads an address upper-cased to fit QR alphanumeric mode (ISO/IEC 18004: digits, capitals, space and $%*+-./: only)", () => {
    expect(lotCodeFromScan("HTTPS://GRAINLINE.EXAMPLE/LOTS/P26-0001")).toBe("P26-0001");
  });

  it("percent-decodes the path segment (RFC 3986 §2.1: %2D is '-')", () => {
    expect(lotCodeFromScan("https://grainline.example/lots/P26%2D0002")).toBe("P26-0002");
  });

  it("rejects other pages of the site and codes that are not lot codes", () => {
    expect(readScanText("https://grainline.example/lots")).toBeNull();
    expect(readScanText("https://grainline.example/lots/P26-0001/events")).toBeNull();
    expect(readScanText("https://grainline.example/lots/NOT-A-CODE")).toBeNull();
    expect(readScanText("https://grainline.example/lots/%E0%A4%A")).toBeNull(); // malformed escape
    expect(readScanText("ftp://grainline.example/lots/P26-0001")).toBeNull();
  });
});

// GS1 Digital Link Standard: URI Syntax — scheme http(s) in either case, a domain with an
// optional path of its own, /01/{gtin}, key qualifiers in the standard's order (22, 10, 21),
// data attributes in the query string, values percent-encoded ("%2d for a hyphen").
describe("GS1 Digital Link bottle URI: /01/{gtin}/10/{lot}", () => {
  it("takes the lot from AI 10", () => {
    expect(readScanText(`https://id.kirinoha.example/01/${GS1_EXAMPLE_GTIN}/10/BT26-0001`)).toEqual({ code: "BT26-0001", source: "digital-link" });
    // What our own bottle QR carries (src/domain/gtin.ts), read back.
    expect(lotCodeFromScan(digitalLinkUri("https://kirinoha.example", "4006381333931", "BT26-0002"))).toBe("BT26-0002");
  });

  it("accepts a path stem, key qualifiers 22 and 21 around 10, and data attributes in the query", () => {
    expect(lotCodeFromScan(`https://example.com/products/01/${GS1_EXAMPLE_GTIN}/22/A1/10/BT26-0004/21/12345`)).toBe("BT26-0004");
    expect(lotCodeFromScan(`HTTPS://ID.GS1.ORG/01/09521234543213/10/BT26-0006`)).toBe("BT26-0006");
    expect(lotCodeFromScan(`https://example.com/01/${GS1_EXAMPLE_GTIN}/10/BT26-0005?17=271231`)).toBe("BT26-0005");
  });

  it("accepts the GTIN-13 form and percent-decodes the lot", () => {
    // 4006381333931: a GTIN-13 whose mod-10 check digit (GS1 General Specifications §7.9) is 1, worked by hand.
    expect(lotCodeFromScan("https://example.com/01/4006381333931/10/bt26%2D0003")).toBe("BT26-0003");
  });

  it("rejects a wrong GTIN check digit, a missing lot and a lot that is not one of ours", () => {
    expect(readScanText("https://example.com/01/09506000134353/10/BT26-0001")).toBeNull();
    expect(readScanText(`https://example.com/01/${GS1_EXAMPLE_GTIN}`)).toBeNull();
    expect(readScanText(`https://example.com/01/${GS1_EXAMPLE_GTIN}/10/ABC123`)).toBeNull();
  });
});

describe("a typed code", () => {
  it("is normalised: trimmed, upper case, spaces dropped", () => {
    expect(readScanText("  p26-0002 ")).toEqual({ code: "P26-0002", source: "typed" });
    expect(lotCodeFromScan("h26 - 0007")).toBe("H26-0007");
  });

  it("gets its hyphen back when typed without it (the year is always two digits)", () => {
    expect(lotCodeFromScan("p260002")).toBe("P26-0002");
    expect(lotCodeFromScan("BT2600012")).toBe("BT26-00012");
  });

  it("is null for anything else", () => {
    expect(readScanText("")).toBeNull();
    expect(readScanText("hello")).toBeNull();
    expect(readScanText("P26-12")).toBeNull();
    expect(readScanText("WIFI:S:brewery;T:WPA;P:secret;;")).toBeNull();
  });
});
