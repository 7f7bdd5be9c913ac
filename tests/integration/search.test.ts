// The office search box: lot codes with or without the hyphen, GTIN/JAN (GS1 General
// Specifications: a JAN-13 is the GTIN-13, and the GTIN-14 with a leading 0 is the same item),
// product and tank names, growers and fields — and only what the reader may see.
import { describe, expect, it } from "vitest";
import { getSqlite } from "@/server/platform/db";
import { createProduct } from "@/server/ledger/products";
import { searchEverything } from "@/server/trace/search";

const user = (id: string, role: "admin" | "brewer" | "grower" | "miller" | "sales", partyId: string) => ({ id, role, partyId, email: "", name: "" });
const admin = user("user-admin", "admin", "brewery-kirinoha");
const brewer = user("user-brewer", "brewer", "brewery-kirinoha");
const ikeda = user("user-grower", "grower", "grower-ikeda");
const nakase = user("user-grower2", "grower", "grower-nakase");
const miller = user("user-miller", "miller", "mill-shirotae");
const t = (key: string) => key;

const codeOf = (sql: string) => (getSqlite().prepare(sql).get() as { code: string }).code;
const hits = (r: ReturnType<typeof searchEverything>) => ({ ...r, query: undefined });

describe("search: lot codes", () => {
  it("finds H26-0001 typed as H260001, h26 0001 or with its hyphen", () => {
    for (const q of ["H260001", "h26 0001", "H26-0001"]) expect(searchEverything(brewer, q).lots.map((l) => l.code)).toContain("H26-0001");
  });

  it("answers another grower's lot exactly as a code no lot has: no results (visibleTo)", () => {
    // H26-0001 is Ikeda Farm's harvest (tests/authz/matrix.ts); Nakase Family Paddies neither holds nor made it.
    expect(searchEverything(ikeda, "H260001").lots.map((l) => l.code)).toContain("H26-0001");
    expect(hits(searchEverything(nakase, "H260001"))).toEqual(hits(searchEverything(nakase, "ZZ990001")));
    expect(searchEverything(nakase, "H260001").lots).toEqual([]);
  });
});

describe("search: GTIN/JAN and products", () => {
  it("finds the seeded bottlings of GTIN 9506000134352 written as JAN-13 or GTIN-14", () => {
    // 9506000134352: GS1's Digital Link example GTIN, the seed's first bottling.
    const jan = searchEverything(brewer, "9506000134352").bottlings.map((l) => l.code);
    expect(jan.length).toBeGreaterThan(0);
    expect(searchEverything(brewer, "09506000134352").bottlings.map((l) => l.code)).toEqual(jan);
    expect(searchEverything(brewer, "9506000134353").bottlings).toEqual([]);
  });

  it("finds a product by brand name and by GTIN, for the brewery's readers only", () => {
    // 9506000134901: GS1 example range, check digit 1 by §7.9, worked by hand from the right: 3×(0+4+1+0+6+5) + (9+3+0+0+0+9) = 69, so 1.
    createProduct(admin, { name: "Kirinoha Snow Lantern", category: "", bottleMl: "300", gtin: "9506000134901" }, t);
    expect(searchEverything(brewer, "snow lantern").products.map((p) => p.name)).toEqual(["Kirinoha Snow Lantern"]);
    expect(searchEverything(brewer, "09506000134901").products.map((p) => p.gtin)).toEqual(["09506000134901"]);
    expect(searchEverything(miller, "snow lantern").products).toEqual([]);
    expect(hits(searchEverything(miller, "snow lantern"))).toEqual(hits(searchEverything(miller, "no such brand")));
  });
});

describe("search: tanks, growers and fields", () => {
  it("finds a tank by its name: the tank lot and the register's tank", () => {
    const r = searchEverything(brewer, "Tank 3");
    expect(r.tanks.map((x) => x.name)).toContain("Tank 3");
    expect(r.tanks.every((x) => x.kind === "tank")).toBe(true);
    expect(searchEverything(nakase, "Tank 3").tanks).toEqual([]);
  });

  it("shows growers and fields to the office; a grower sees only its own", () => {
    expect(searchEverything(brewer, "Ikeda").growers.map((g) => g.id)).toEqual(["grower-ikeda"]);
    expect(searchEverything(brewer, "River Flat").fields.map((f) => f.id)).toEqual(["field-nakase-river"]);
    expect(searchEverything(nakase, "River Flat").fields.map((f) => f.id)).toEqual(["field-nakase-river"]);
    // Another grower's paddy and name answer as nothing at all.
    expect(hits(searchEverything(ikeda, "River Flat"))).toEqual(hits(searchEverything(ikeda, "No Such Paddy")));
    expect(searchEverything(ikeda, "Nakase").growers).toEqual([]);
    expect(searchEverything(miller, "Ikeda").growers).toEqual([]);
  });

  it("ignores LIKE wildcards typed into the box", () => {
    expect(searchEverything(brewer, "%%").lots).toEqual([]);
    expect(searchEverything(brewer, "__").fields).toEqual([]);
  });
});
