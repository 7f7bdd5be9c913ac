import { describe, expect, it } from "vitest";
import { GET as claimsRoute } from "../../app/api/claims/[code]/route";
import { getSqlite } from "@/server/platform/db";
import { ancestryOf } from "@/server/trace/ancestry";
import { claimedCategories } from "@/server/trace/claims";
import { call, jsonRequest, signInAs } from "../support/api";

// The seeded 2024–25 season: Tank 1 of 50 % rice by the ginjo method, Tank 2 of 60 % rice by
// the ginjo method, Tank 3 of 60 % rice with 40 kg of distilled alcohol on 600 kg of rice.
// Categories per the NTA labelling standard (../shared/references.md).
const codeOf = (sql: string) => (getSqlite().prepare(sql).get() as { code: string }).code;
const tank = (name: string) => codeOf(`select code from lots where kind = 'tank' and json_extract(attributes, '$.tankName') = '${name}'`);
const bottledOf = (gtin: string) => codeOf(`select code from lots where kind = 'bottled' and json_extract(attributes, '$.gtin') = '${gtin}' order by id limit 1`);

async function claims(code: string) {
  const cookie = await signInAs("sales@example.com");
  const res = await call(claimsRoute, jsonRequest(`/api/claims/${code}`, { cookie }), { code });
  return res;
}
const eligible = (body: { categories: { name: string; eligible: boolean }[] }) => body.categories.filter((c) => c.eligible).map((c) => c.name);

describe("premium-category claims from the lineage", () => {
  it("Tank 1: 50 %, koji 20 % on the dry basis, 1st grade at worst, no alcohol → junmai daiginjo", async () => {
    const { status, body } = await claims(tank("Tank 1"));
    expect(status).toBe(200);
    expect(body.polishingRatioPct).toBeCloseTo(50, 9);
    expect(body.kojiRatioPct).toBeCloseTo(20, 6);
    expect(body.lowestGrade).toBe("1");
    expect(body.addedAlcoholKg).toBe(0);
    expect(eligible(body)).toEqual(["junmai daiginjo", "junmai ginjo", "tokubetsu junmai", "junmai"]);
  });

  it("the bottling of Tank 1 carries the same claims", async () => {
    const { body } = await claims(bottledOf("9506000134352"));
    expect(eligible(body)).toEqual(["junmai daiginjo", "junmai ginjo", "tokubetsu junmai", "junmai"]);
  });

  it("Tank 3: alcohol 6.7 % of the rice, no ginjo method → tokubetsu honjozo and honjozo", async () => {
    const { body } = await claims(tank("Tank 3"));
    expect(body.addedAlcoholKg).toBe(40);
    expect(eligible(body)).toEqual(["tokubetsu honjozo", "honjozo"]);
    expect(body.categories.find((c: { name: string }) => c.name === "junmai").reasons).toEqual(["distilled alcohol was added"]);
  });

  it("a blend of Tank 2 and Tank 3 earns only what both tanks earn: nothing here", async () => {
    const { body } = await claims(bottledOf("9506000134376"));
    expect(body.tanks.map((t: { code: string }) => t.code).sort()).toEqual([tank("Tank 2"), tank("Tank 3")].sort());
    expect(eligible(body)).toEqual([]);
    expect(body.categories.find((c: { name: string }) => c.name === "junmai ginjo").reasons.some((r: string) => r.endsWith("distilled alcohol was added"))).toBe(true);
  });

  it("a blend states the least polished rice and the smallest koji share of its tanks", async () => {
    const [two, three, blend] = [await claims(tank("Tank 2")), await claims(tank("Tank 3")), await claims(bottledOf("9506000134376"))];
    // A label may claim only what holds for every part (NTA labelling standard, ../shared/references.md).
    expect(blend.body.polishingRatioPct).toBeCloseTo(Math.max(two.body.polishingRatioPct, three.body.polishingRatioPct), 9);
    expect(blend.body.kojiRatioPct).toBeCloseTo(Math.min(two.body.kojiRatioPct, three.body.kojiRatioPct), 9);
    expect(blend.body.polishingRatioPct).toBeCloseTo(60, 9);
  });

  it("refuses lots that are not tanks, sake, blends or bottlings", async () => {
    const { status, body } = await claims("P26-0001");
    expect(status).toBe(422);
    expect(body.error.fields.code).toBeDefined();
  });

  // The provenance card names only the categories earned (claimedCategories, no reasons worded):
  // the same categories and koji share the API's worded answer gives, for every claimable lot.
  it("the provenance card's categories are the worded claims' eligible ones, lot by lot", async () => {
    const lots = getSqlite().prepare("select id, code from lots where kind in ('tank', 'sake', 'blend', 'bottled') order by id").all() as { id: number; code: string }[];
    expect(lots.length).toBeGreaterThan(5);
    let earning = 0;
    for (const lot of lots) {
      const { body } = await claims(lot.code);
      const card = claimedCategories(lot.id, ancestryOf(lot.id));
      expect(card.eligible, lot.code).toEqual(eligible(body));
      expect(card.kojiRatioPct, lot.code).toBe(body.kojiRatioPct);
      if (card.eligible.length) earning++;
    }
    expect(earning).toBeGreaterThan(0);
  });
});
