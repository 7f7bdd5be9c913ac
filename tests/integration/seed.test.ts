import http from "node:http";
import type { AddressInfo } from "node:net";
import { describe, expect, it } from "vitest";
import { migrateDatabase, openDatabase } from "@/db/client";
import { isValidGtin } from "@/domain/gtin";
import { getDb, getSqlite } from "@/server/platform/db";
import { listAwaitingPolishing } from "@/server/ledger/lots";
import { seedDemo } from "@/server/records/seed";
import { tableDigests } from "../support/api";

const count = (sql: string) => (getSqlite().prepare(sql).get() as { n: number }).n;

describe("the demo scenario", () => {
  it("seeds one season: two varieties, runs to 50/60/70 %, a correction, receipts at mill and brewery", () => {
    expect(count("select count(*) as n from lots where kind = 'harvest' and crop_year = 2026")).toBe(6);
    expect(count("select count(distinct variety) as n from lots where kind = 'harvest' and crop_year = 2026")).toBe(2);
    const ratios = getSqlite().prepare("select polishing_ratio_pct as r from lots where kind = 'polished' and on_hand > 0 and code like 'P26-%' order by r").all() as { r: number }[];
    expect(ratios.map((x) => x.r)).toEqual([50, 60, 60, 70]);
    expect(count("select count(*) as n from events where step = 'correcting'")).toBe(1);
    const received = (kind: string) => count(`select count(*) as n from events e join parties p on p.id = e.party_id where e.step = 'receiving' and p.kind = '${kind}' and e.at >= ${Date.parse("2026-01-01")}`);
    expect(received("mill")).toBe(6);
    expect(received("brewery")).toBe(4);
    expect(listAwaitingPolishing("mill-shirotae").map((l) => l.variety)).toEqual(["Omachi"]);
  });

  it("seeds the finished 2024–25 season: three tanks pressed, a blend, bottlings with valid GTINs, a shipment", () => {
    expect(count("select count(*) as n from lots where kind = 'tank'")).toBe(3);
    expect(count("select count(*) as n from events where step = 'pressing'")).toBe(3);
    expect(count("select count(*) as n from lots where kind = 'blend'")).toBe(1);
    const gtins = getSqlite().prepare("select json_extract(attributes, '$.gtin') as g from lots where kind = 'bottled'").all() as { g: string }[];
    expect(gtins.length).toBe(4);
    expect(gtins.every(({ g }) => isValidGtin(g))).toBe(true);
    expect(count("select count(*) as n from events e join parties p on p.id = e.counterparty_id where e.step = 'shipping' and p.kind = 'buyer'")).toBe(1);
  });

  it("seeds nothing twice", async () => {
    const before = await tableDigests();
    expect(await seedDemo(getDb())).toBe(false);
    expect(await tableDigests()).toEqual(before);
  });
});

describe("seeding with SMTP set up", () => {
  it("keeps the demo's statements in the outbox: nothing is sent to the invented parties", async () => {
    // A listener standing in for an SMTP server: any connection to it would be a message leaving.
    let connections = 0;
    const smtp = http.createServer().on("connection", (socket) => {
      connections++;
      socket.destroy();
    });
    await new Promise<void>((r) => smtp.listen(0, "127.0.0.1", r));
    const saved = { host: process.env.SMTP_HOST, port: process.env.SMTP_PORT };
    process.env.SMTP_HOST = "127.0.0.1";
    process.env.SMTP_PORT = String((smtp.address() as AddressInfo).port);
    const { db, sqlite } = openDatabase(":memory:");
    try {
      migrateDatabase(db);
      expect(await seedDemo(db)).toBe(true);
      const rows = sqlite.prepare("select transport from outbox").all() as { transport: string }[];
      expect(rows.length).toBeGreaterThan(0);
      expect(new Set(rows.map((r) => r.transport))).toEqual(new Set(["local"]));
      expect(connections).toBe(0);
    } finally {
      sqlite.close();
      smtp.close();
      for (const [key, value] of [["SMTP_HOST", saved.host], ["SMTP_PORT", saved.port]] as const) {
        if (value === undefined) delete process.env[key];
        else process.env[key] = value;
      }
    }
  });
});
