import { describe, expect, it } from "vitest";
import { getSqlite } from "@/server/platform/db";
import { ancestryOf, ancestryReadAnew } from "@/server/trace/ancestry";
import { claimedCategories } from "@/server/trace/claims";
import { keptCounts } from "@/server/trace/kept-by-lot";
import { provenanceOf, publicProvenance } from "@/server/trace/provenance";
import { warmInBackground } from "@/server/trace/warm-up";

// After a start, the first provenance answer sets working out in the background every tank's
// category facts and every dated lot's dates, so that the first view of a house blend does not
// judge its tanks while the buyer waits. On the seeded season: the first answer leaves nothing kept
// but its own lineage's figures; once the warm-up is done, every tank and dated lot is kept, and
// every bottling's answer is the one worked out anew with nothing kept.
describe("the warm-up after a start", () => {
  const count = (kinds: string[]) => (getSqlite().prepare(`select count(*) as n from lots where kind in (${kinds.map(() => "?").join(", ")})`).get(...kinds) as { n: number }).n;

  it("keeps every tank's facts and every dated lot's dates, and the answers stay the ones worked out anew", async () => {
    const tanks = count(["tank"]);
    const dated = count(["tank", "sake", "lees", "bottled"]);
    expect(tanks).toBeGreaterThan(1);
    expect(keptCounts()).toMatchObject({ "tank facts": 0, "key dates": 0 });
    // The seeded single-tank bottling (GTIN 9506000134352): its own figures only, until the warm-up runs.
    const { bottling } = publicProvenance("09506000134352", (getSqlite().prepare("select code from lots where json_extract(attributes, '$.gtin') = '9506000134352' order by id limit 1").get() as { code: string }).code);
    expect(keptCounts()["tank facts"]).toBeLessThan(tanks);
    await warmInBackground();
    expect(keptCounts()).toMatchObject({ "tank facts": tanks, "key dates": dated });
    for (const { id, code, kind, contentIn } of getSqlite().prepare("select id, code, kind, content_in as contentIn from lots where kind = 'bottled'").all() as { id: number; code: string; kind: string; contentIn: number }[]) {
      const kept = ancestryOf(id);
      const anew = { ...ancestryReadAnew(id), mark: null };
      const head = { id, code, kind, contentIn };
      expect(provenanceOf(head, claimedCategories(id, kept), kept), code).toEqual(provenanceOf(head, claimedCategories(id, anew), anew));
    }
    expect(bottling.id).toBeGreaterThan(0);
  });
});
