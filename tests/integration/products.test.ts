// The product register and bottlings that name a product: the category a label claims is held
// against the claims of the sake bottled (NTA labelling standard for sake, ../shared/references.md).
import { describe, expect, it } from "vitest";
import { gtinCheckDigit } from "@/domain/gtin";
import { getSqlite } from "@/server/platform/db";
import { createProduct, listProducts } from "@/server/ledger/products";
import { provenanceFor, publicProvenance } from "@/server/trace/provenance";
import { POST as eventsRoute } from "../../app/api/events/route";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

const t = (key: string, values?: Record<string, string | number>) => (values ? `${key} ${JSON.stringify(values)}` : key);
const admin = { id: "user-admin", role: "admin" as const, partyId: "brewery-kirinoha", email: "", name: "" };
const brewer = { id: "user-brewer", role: "brewer" as const, partyId: "brewery-kirinoha", email: "", name: "" };
const sales = { id: "user-sales", role: "sales" as const, partyId: "brewery-kirinoha", email: "", name: "" };
const one = <T>(sql: string, ...args: unknown[]) => getSqlite().prepare(sql).get(...args) as T;
// GS1's example range (prefix 950, as the seed uses); check digits by §7.9, held by gtin.test.ts.
const gtin13 = (n: number) => { const body = `950600013${String(n).padStart(3, "0")}`; return body + gtinCheckDigit(body); };
// The seed's sake lots, oldest first: Tank 1 (50 % rice, ginjo method, no alcohol added: junmai
// daiginjo) and Tank 3 (60 % rice, no ginjo method, 40 kg of 95 % alcohol: honjozo at best).
const sake = (n: number) => one<{ code: string }>("select code from lots where kind = 'sake' order by id limit 1 offset ?", n).code;
const bottle = (cookie: string, lot: string, product: number | string, gtin: string, count = 10, ml = 720) =>
  call(eventsRoute, jsonRequest("/api/events", { cookie, body: { step: "bottling", inputs: [{ lot, quantity: (count * ml) / 1000 }], outputs: [{ kind: "bottled", quantity: count, bottleMl: ml, gtin, product }] } }));

describe("product register", () => {
  it("keeps a JAN-13 as its GTIN-14, refuses the same GTIN written either way, and audits the entry", () => {
    const jan = gtin13(801);
    const { id } = createProduct(admin, { name: "Asagiri Junmai Ginjo", category: "junmai ginjo", bottleMl: "720", gtin: jan }, t);
    expect(listProducts().find((p) => p.id === id)).toMatchObject({ gtin: `0${jan}`, bottleMl: 720, category: "junmai ginjo" });
    expect(() => createProduct(admin, { name: "Copy", category: "", bottleMl: "720", gtin: `0${jan}` }, t)).toThrow(expect.objectContaining({ fields: { gtin: ["validation.gtinTaken"] } }));
    expect(one<{ n: number }>("select count(*) as n from audit_log where action = 'product.created' and subject = ?", `product:${id}`).n).toBe(1);
  });

  it("refuses a wrong check digit and a category the labelling standard does not name, writing nothing", async () => {
    const before = await tableDigests();
    const jan = gtin13(802);
    const wrong = jan.slice(0, -1) + String((Number(jan.at(-1)) + 1) % 10);
    expect(() => createProduct(admin, { name: "X", category: "", bottleMl: "720", gtin: wrong }, t)).toThrow();
    expect(() => createProduct(admin, { name: "X", category: "super ginjo", bottleMl: "720", gtin: jan }, t)).toThrow();
    expect(await tableDigests()).toEqual(before);
  });

  it("is the office's: brewer and sales are refused (403) and nothing is written", async () => {
    const before = await tableDigests();
    for (const who of [brewer, sales]) expect(() => createProduct(who, { name: "X", category: "", bottleMl: "720", gtin: gtin13(803) }, t)).toThrow(expect.objectContaining({ status: 403 }));
    expect(await tableDigests()).toEqual(before);
  });
});

describe("a bottling names its product", () => {
  it("warns when the product claims junmai ginjo on sake that is not eligible, and the office card says so", async () => {
    const cookie = await signInAs("brewer@example.com");
    const jan = gtin13(811);
    const { id } = createProduct(admin, { name: "Asagiri Junmai Ginjo 720", category: "junmai ginjo", bottleMl: "720", gtin: jan }, t);
    const res = await bottle(cookie, sake(2), id, jan);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.warnings.join(" ")).toMatch(/junmai ginjo/);
    const code = res.body.outputs[0].code as string;
    const p = provenanceFor(sales, code);
    expect(p.product).toMatchObject({ name: "Asagiri Junmai Ginjo 720", category: "junmai ginjo", bottleMl: 720, claimSupported: false });
    // The public page answers on the GTIN-14 and still names the product.
    expect(publicProvenance(`0${jan}`, code).provenance.product?.name).toBe("Asagiri Junmai Ginjo 720");
  });

  it("gives no warning when the lineage supports the claim (Tank 1: 50 % rice, ginjo method, no alcohol added)", async () => {
    const cookie = await signInAs("brewer@example.com");
    const jan = gtin13(812);
    const { id } = createProduct(admin, { name: "Asagiri Junmai Ginjo (Tank 1)", category: "junmai ginjo", bottleMl: "720", gtin: jan }, t);
    const res = await bottle(cookie, sake(0), id, jan);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.warnings).toEqual([]);
    expect(provenanceFor(sales, res.body.outputs[0].code).product?.claimSupported).toBe(true);
  });

  it("refuses a GTIN or size other than the product's, and an unknown product, changing nothing", async () => {
    const cookie = await signInAs("brewer@example.com");
    const jan = gtin13(813);
    const { id } = createProduct(admin, { name: "Asagiri Honjozo 1800", category: "honjozo", bottleMl: "1800", gtin: jan }, t);
    const before = await tableDigests(["idempotency_keys"]);
    const otherGtin = await bottle(cookie, sake(2), id, gtin13(814), 2, 1800);
    expect(otherGtin.status).toBe(422);
    expect(Object.keys(otherGtin.body.error.fields)).toContain("outputs.0.gtin");
    const otherSize = await bottle(cookie, sake(2), id, jan, 2, 720);
    expect(Object.keys(otherSize.body.error.fields)).toContain("outputs.0.bottleMl");
    const unknown = await bottle(cookie, sake(2), 999_999, jan, 2, 1800);
    expect(Object.keys(unknown.body.error.fields)).toContain("outputs.0.product");
    expect(await tableDigests(["idempotency_keys"])).toEqual(before);
  });

  it("the mill cannot bottle the brewery's sake with a product: refused, nothing written", async () => {
    const cookie = await signInAs("miller@example.com");
    const jan = gtin13(815);
    const { id } = createProduct(admin, { name: "Mill probe", category: "", bottleMl: "720", gtin: jan }, t);
    const before = await tableDigests(["idempotency_keys"]);
    const res = await bottle(cookie, sake(2), id, jan);
    expect([403, 404, 422]).toContain(res.status);
    expect(await tableDigests(["idempotency_keys"])).toEqual(before);
  });
});
