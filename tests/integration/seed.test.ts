import { describe, expect, it } from "vitest";
import { getDb, getSqlite } from "@/server/db";
import { listAwaitingPolishing } from "@/server/lots";
import { seedDemo } from "@/server/seed";
import { tableDigests } from "../support/api";

const count = (sql: string) => (getSqlite().prepare(sql).get() as { n: number }).n;

describe("the demo scenario", () => {
  it("seeds one season: two varieties, runs to 50/60/70 %, a correction, receipts at mill and brewery", () => {
    expect(count("select count(*) as n from lots where kind = 'harvest'")).toBe(6);
    expect(count("select count(distinct variety) as n from lots where kind = 'harvest'")).toBe(2);
    const ratios = getSqlite().prepare("select polishing_ratio_pct as r from lots where kind = 'polished' and on_hand > 0 order by r").all() as { r: number }[];
    expect(ratios.map((x) => x.r)).toEqual([50, 60, 60, 70]);
    expect(count("select count(*) as n from events where step = 'correcting'")).toBe(1);
    expect(count("select count(*) as n from events e join parties p on p.id = e.party_id where e.step = 'receiving' and p.kind = 'mill'")).toBe(6);
    expect(count("select count(*) as n from events e join parties p on p.id = e.party_id where e.step = 'receiving' and p.kind = 'brewery'")).toBe(4);
    expect(listAwaitingPolishing("mill-shirotae").map((l) => l.variety)).toEqual(["Omachi"]);
  });

  it("seeds nothing twice", async () => {
    const before = await tableDigests();
    expect(await seedDemo(getDb())).toBe(false);
    expect(await tableDigests()).toEqual(before);
  });
});
