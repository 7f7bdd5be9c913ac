import { readFileSync } from "node:fs";
import path from "node:path";
import Ajv, { type ValidateFunction } from "ajv";
import addFormats from "ajv-formats";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as epcisRoute } from "../../app/api/trace/[code]/epcis/route";
import { getSqlite } from "@/server/platform/db";
import { jsonRequest, signInAs } from "../support/api";

// GS1's EPCIS 2.0 JSON schema and example 9.6.4, copied unchanged (fixtures/epcis/SOURCE.md),
// validated the way SOURCE.md (and the GS1 repository's JSON-Schema/README.md) says.
const fixture = (name: string) => JSON.parse(readFileSync(path.resolve("fixtures/epcis", name), "utf8")) as Record<string, unknown>;
let validate: ValidateFunction;

type QuantityElement = { epcClass: string; quantity?: number; uom?: string };
type EpcisEvent = Record<string, unknown> & { type: string; eventID: string; bizStep: string; eventTime: string; eventTimeZoneOffset: string };
type EpcisDocument = { "@context": unknown[]; type: string; schemaVersion: string; creationDate: string; epcisBody: { eventList: EpcisEvent[] } };

let sales: string;
const lotCode = (where: string) => (getSqlite().prepare(`select code from lots where ${where} order by id`).get() as { code: string }).code;

async function exportOf(code: string, cookie: string | undefined = sales) {
  const response = await epcisRoute(jsonRequest(`/api/trace/${code}/epcis`, { cookie }), { params: Promise.resolve({ code }) });
  return { response, body: JSON.parse(await response.text()) as EpcisDocument };
}
const quantities = (e: EpcisEvent) => ["quantityList", "inputQuantityList", "outputQuantityList"].flatMap((k) => (e[k] as QuantityElement[] | undefined) ?? []);
const count = <T,>(items: T[], key: (t: T) => string) => items.reduce<Record<string, number>>((acc, t) => ({ ...acc, [key(t)]: (acc[key(t)] ?? 0) + 1 }), {});

beforeAll(async () => {
  const ajv = new Ajv({ strict: false });
  addFormats(ajv);
  validate = ajv.compile(fixture("EPCIS-JSON-Schema.json"));
  sales = await signInAs("sales@example.com");
});

describe("the validator set-up, proven on GS1's own example", () => {
  it("accepts example 9.6.4 once its blank-node id is removed, and refuses it with the id", () => {
    const example = fixture("Example_9.6.4-TransformationEvent.jsonld");
    // "_:document1" is a JSON-LD blank node, not a URI: ajv-formats' `uri` refuses it.
    expect(validate(example)).toBe(false);
    expect(validate.errors?.map((e) => e.instancePath)).toContain("/id");
    const { id: _blankNode, ...withoutId } = example;
    expect(validate(withoutId), JSON.stringify(validate.errors)).toBe(true);
  });
});

// The seeded 2024–25 season (src/server/records/seed-brewing.ts), from its first harvest lot.
describe("EPCIS 2.0 export of a 2024 harvest lot's recall", () => {
  let document: EpcisDocument;
  let response: Response;
  beforeAll(async () => {
    ({ response, body: document } = await exportOf(lotCode("kind = 'harvest' and crop_year = 2024")));
  });

  it("is a JSON-LD EPCISDocument that GS1's schema accepts", () => {
    expect(response.status).toBe(200);
    expect(response.headers.get("content-type")).toMatch(/^application\/ld\+json/);
    expect(document["@context"]).toContain("https://ref.gs1.org/standards/epcis/2.0.0/epcis-context.jsonld");
    expect(document).toMatchObject({ type: "EPCISDocument", schemaVersion: "2.0" });
    expect(Number.isNaN(Date.parse(document.creationDate))).toBe(false);
    expect(validate(document), JSON.stringify(validate.errors?.slice(0, 5))).toBe(true);
  });

  it("holds each step of the season as the right event type", () => {
    const events = document.epcisBody.eventList;
    // 1 polishing, 2 soaks, 2 steamings, 1 split, 1 koji, 1 starter, 3 mash additions, 1 pressing, 2 bottlings.
    expect(count(events, (e) => e.type)).toEqual({ TransformationEvent: 14, ObjectEvent: 11 });
    // Registration, two dispatches and their receipts (to the mill, to the brewery), the shipment to the buyer, and five koji-room temperatures.
    expect(count(events.filter((e) => e.type === "ObjectEvent"), (e) => `${e.action} ${e.bizStep}`)).toEqual({
      "ADD commissioning": 1,
      "OBSERVE receiving": 2,
      "OBSERVE shipping": 3,
      "OBSERVE sensor_reporting": 5,
    });
    expect(count(events.filter((e) => e.type === "TransformationEvent"), (e) => e.bizStep.replace("https://grainline.invalid/bizstep/", ""))).toEqual({
      polishing: 1, soaking: 2, steaming: 2, splitting: 1, "koji-making": 1, starter: 1, "mash-addition": 3, pressing: 1, bottling: 2,
    });
    for (const e of events) expect(e.eventTimeZoneOffset).toBe("+09:00");
  });

  it("gives every quantity a UN/ECE Rec 20 unit: KGM, LTR or H87", () => {
    const all = document.epcisBody.eventList.flatMap(quantities).filter((q) => q.quantity !== undefined);
    expect(all.length).toBeGreaterThan(30);
    expect(new Set(all.map((q) => q.uom))).toEqual(new Set(["KGM", "LTR", "H87"]));
    // Bottles, and only bottles, are counted in pieces; bottled lots are GS1 batches by Digital Link.
    for (const q of all) expect(q.uom === "H87", q.epcClass).toBe(q.epcClass.startsWith("https://id.gs1.org/01/09506000134352/10/BT"));
  });

  it("ships 200 bottles to the buyer, from the brewery, at 14:00 in Japan", () => {
    const shipment = document.epcisBody.eventList.find((e) => e.bizStep === "shipping" && e["gl:referenceDocument"] === "INV-2025-031")!;
    expect(shipment).toMatchObject({
      eventTime: "2025-03-20T14:00:00.000+09:00",
      disposition: "in_transit",
      sourceList: [{ type: "possessing_party", source: "https://id.grainline.invalid/party/brewery-kirinoha" }],
      destinationList: [{ type: "possessing_party", destination: "https://id.grainline.invalid/party/buyer-minato" }],
      "gl:referenceDocument": "INV-2025-031",
    });
    expect(quantities(shipment)).toEqual([{ epcClass: expect.stringMatching(/^https:\/\/id\.gs1\.org\/01\/09506000134352\/10\/BT25-\d{4}$/), quantity: 200, uom: "H87" }]);
    // 14:00 in Japan is 05:00 UTC.
    expect(new Date(shipment.eventTime).toISOString()).toBe("2025-03-20T05:00:00.000Z");
  });

  it("fails the schema once an eventTimeZoneOffset is broken", () => {
    const broken = structuredClone(document);
    broken.epcisBody.eventList[0]!.eventTimeZoneOffset = "+9:00";
    expect(validate(broken)).toBe(false);
    expect(validate.errors?.some((e) => e.instancePath.endsWith("/eventTimeZoneOffset") && e.keyword === "pattern")).toBe(true);
  });

  it("would also fail with a unit written as Grainline writes it, or a made-up CBV term", () => {
    const unit = structuredClone(document);
    (unit.epcisBody.eventList[0]!.quantityList as QuantityElement[])[0]!.uom = "kg";
    expect(validate(unit)).toBe(false);
    const step = structuredClone(document);
    step.epcisBody.eventList.find((e) => e.type === "TransformationEvent")!.bizStep = "transforming";
    expect(validate(step)).toBe(false);
  });
});

describe("from a lot that is not a harvest", () => {
  it("exports a blend's own making and its bottling, with the other sakes as inputs", async () => {
    const { body } = await exportOf(lotCode("kind = 'blend'"));
    expect(validate(body), JSON.stringify(validate.errors?.slice(0, 5))).toBe(true);
    // seed-brewing.ts: 400 L + 600 L blended to 1000 L, bottled as 1000 × 720 mL under GTIN 9506000134376.
    const [blending, bottling, ...rest] = body.epcisBody.eventList;
    expect(rest).toEqual([]);
    expect(blending!.bizStep).toBe("https://grainline.invalid/bizstep/blending");
    expect((blending!.inputQuantityList as QuantityElement[]).map((q) => [q.quantity, q.uom])).toEqual([[400, "LTR"], [600, "LTR"]]);
    expect(bottling!.outputQuantityList).toEqual([{ epcClass: expect.stringMatching(/^https:\/\/id\.gs1\.org\/01\/09506000134376\/10\/BT25-\d{4}$/), quantity: 1000, uom: "H87" }]);
  });
});

describe("a corrected event (seeded 2026 season: a polishing run reversed and recorded again)", () => {
  it("becomes an error declaration: the same event and eventID, with errorDeclaration", async () => {
    const { body } = await exportOf(lotCode("kind = 'harvest' and crop_year = 2026 and field_id = 'field-nakase-shrine'"));
    expect(validate(body), JSON.stringify(validate.errors?.slice(0, 5))).toBe(true);
    const fix = getSqlite().prepare("select corrects from events where step = 'correcting' and reason like 'Polished weight%'").get() as { corrects: number };
    const sameId = body.epcisBody.eventList.filter((e) => e.eventID === `https://id.grainline.invalid/event/${fix.corrects}`);
    expect(sameId.map((e) => e.type)).toEqual(["TransformationEvent", "TransformationEvent"]);
    const { errorDeclaration, recordTime: _r1, ...declared } = sameId[1]!;
    const { recordTime: _r2, ...original } = sameId[0]!;
    expect(declared).toEqual(original);
    expect(errorDeclaration).toEqual({ declarationTime: "2026-11-03T10:00:00.000+09:00", reason: "did_not_occur", "gl:reason": "Polished weight keyed from the wrong scale ticket" });
    expect(sameId[0]!.errorDeclaration).toBeUndefined();
  });
});

describe("who may export", () => {
  it("refuses a grower with 403 and answers 404 for an unknown code", async () => {
    const grower = await signInAs("grower@example.com");
    expect((await exportOf(lotCode("kind = 'harvest' and crop_year = 2024"), grower)).response.status).toBe(403);
    expect((await exportOf("H99-9999")).response.status).toBe(404);
  });
});
