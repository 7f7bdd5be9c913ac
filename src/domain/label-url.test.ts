import { describe, expect, it } from "vitest";
import { labelPagePath, labelPageUrl, labelSheetPath, lotPageUrl, MAX_LABEL_CODES, parseLabelCodes } from "./label-url";

describe("lotPageUrl", () => {
  it("puts a plain code under /lots/ on the origin", () => {
    expect(lotPageUrl("https://grainline.example", "H26-0001")).toBe("https://grainline.example/lots/H26-0001");
  });

  it("drops trailing slashes of the origin, so the path never has an empty segment", () => {
    expect(lotPageUrl("https://grainline.example/", "H26-0001")).toBe("https://grainline.example/lots/H26-0001");
    expect(lotPageUrl("http://localhost:3000//", "P26-0002")).toBe("http://localhost:3000/lots/P26-0002");
  });

  // RFC 3986 §2.1: percent-encoding is "%" and two upper-case hex digits of each UTF-8 byte.
  it("percent-encodes characters that would change the meaning of the path", () => {
    expect(lotPageUrl("https://g.example", "A/B")).toBe("https://g.example/lots/A%2FB");
    expect(lotPageUrl("https://g.example", "50%")).toBe("https://g.example/lots/50%25");
    expect(lotPageUrl("https://g.example", "X?y=1#z")).toBe("https://g.example/lots/X%3Fy%3D1%23z");
    expect(lotPageUrl("https://g.example", "a b")).toBe("https://g.example/lots/a%20b");
    expect(lotPageUrl("https://g.example", "米")).toBe("https://g.example/lots/%E7%B1%B3");
  });

  it("round-trips through the WHATWG URL parser to exactly one path segment", () => {
    for (const code of ["H26-0001", "A/B", "50%", "X?y=1#z", "a&b+c", "米-1"]) {
      const url = new URL(lotPageUrl("https://g.example/", code));
      const segments = url.pathname.split("/");
      expect(segments).toHaveLength(3);
      expect(segments[1]).toBe("lots");
      expect(decodeURIComponent(segments[2]!)).toBe(code);
      expect(url.search).toBe("");
      expect(url.hash).toBe("");
    }
  });
});

describe("parseLabelCodes", () => {
  it("splits a comma list and normalises each code as the scanner does", () => {
    expect(parseLabelCodes("H26-0001,p26-0002")).toEqual(["H26-0001", "P26-0002"]);
  });

  it("accepts repeated parameters and pasted lists, dropping blanks and repeats", () => {
    expect(parseLabelCodes(["H26-0001, H26-0002", "H26-0001\nP26-0003;;", " "])).toEqual(["H26-0001", "H26-0002", "P26-0003"]);
  });

  it("gives nothing for a missing or empty parameter", () => {
    expect(parseLabelCodes(undefined)).toEqual([]);
    expect(parseLabelCodes(",, ,")).toEqual([]);
  });

  it("leaves the limit to the caller, keeping every code", () => {
    const many = Array.from({ length: MAX_LABEL_CODES + 1 }, (_, i) => `H26-${String(i).padStart(4, "0")}`);
    expect(parseLabelCodes(many.join(","))).toHaveLength(201);
  });
});

describe("labelSheetPath", () => {
  it("builds an address that parses back to the same codes", () => {
    const path = labelSheetPath(["H26-0001", "P26-0002"]);
    const url = new URL(path, "https://g.example");
    expect(url.pathname).toBe("/labels");
    expect(parseLabelCodes(url.searchParams.getAll("codes"))).toEqual(["H26-0001", "P26-0002"]);
    expect(url.searchParams.get("layout")).toBeNull();
    expect(new URL(labelSheetPath(["H26-0001"], "bag"), "https://g.example").searchParams.get("layout")).toBe("bag");
  });
});

describe("what a label's QR holds", () => {
  it("is the GS1 Digital Link URI for a bottle with a valid GTIN, the lot page otherwise", async () => {
    const { labelUrl } = await import("./label-url");
    expect(labelUrl("https://kirinoha.example", { code: "BT26-0001", kind: "bottled", attributes: { gtin: "4006381333931" } })).toBe("https://kirinoha.example/01/04006381333931/10/BT26-0001");
    expect(labelUrl("https://kirinoha.example", { code: "P26-0001", kind: "polished", attributes: {} })).toBe("https://kirinoha.example/l/P26-0001");
  });
});

describe("labelPageUrl", () => {
  it("is the one label route /l/{code}, the code one percent-encoded path segment (RFC 3986 §3.3)", () => {
    expect(labelPageUrl("https://grainline.example/", "P26-0003")).toBe("https://grainline.example/l/P26-0003");
    expect(labelPagePath("A/B")).toBe("/l/A%2FB");
    expect(new URL(labelPageUrl("https://g.example", "X?y=1#z")).pathname).toBe("/l/X%3Fy%3D1%23z");
  });
});
