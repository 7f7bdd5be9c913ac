import { beforeAll, describe, expect, it } from "vitest";
import { SQLiteSyncDialect } from "drizzle-orm/sqlite-core";
import { getSqlite } from "@/server/platform/db";
import { kojiFraction } from "@/server/floor/tanks";
import { ancestryOf, lotsOfKindUp, lotsUpThrough } from "@/server/trace/ancestry";
import { touchedSince } from "@/server/trace/edge-index";
import { claimsForLot } from "@/server/trace/claims";

// A branching ledger written row by row: two tanks from koji, steamed and polished rice, their
// sake, two blends of both, a blend of those blends (with a direct share of one sake), and a
// bottling. Two links were recorded and then reversed (a corrected mistake), and one link was
// recorded in two parts. The walk of distinct lots must give what the path-by-path walk gives.
const lots: [code: string, kind: string, contentIn: number, ratio: number | null][] = [
  ["AX-H1", "harvest", 1000, null], ["AX-H2", "harvest", 1000, null],
  ["AX-P1", "polished", 500, 50], ["AX-P2", "polished", 600, 60], ["AX-P3", "polished", 700, 70],
  ["AX-K1", "koji", 100, 50], ["AX-S1", "steamed", 200, 60], ["AX-K2", "koji", 80, 60],
  ["AX-T1", "tank", 300, 60], ["AX-T2", "tank", 400, 60],
  ["AX-A", "sake", 300, 60], ["AX-B", "sake", 400, 60],
  ["AX-X", "blend", 300, 60], ["AX-Y", "blend", 400, 60], ["AX-Z", "blend", 450, 60], ["AX-BT", "bottled", 450, 60],
];
const edges: [parent: string, child: string, weight: number][] = [
  ["AX-H1", "AX-P1", 500], ["AX-H2", "AX-P2", 600], ["AX-H1", "AX-P3", 700],
  ["AX-P1", "AX-K1", 100], ["AX-P2", "AX-S1", 200], ["AX-P2", "AX-K2", 80],
  ["AX-K1", "AX-T1", 100], ["AX-S1", "AX-T1", 200],
  ["AX-K2", "AX-T2", 80], ["AX-P2", "AX-T2", 320], ["AX-P3", "AX-T2", 100], ["AX-P3", "AX-T2", -100],
  ["AX-T1", "AX-A", 300], ["AX-T2", "AX-B", 400],
  ["AX-A", "AX-X", 100], ["AX-B", "AX-X", 200],
  ["AX-A", "AX-Y", 150], ["AX-A", "AX-Y", 50], ["AX-B", "AX-Y", 200],
  ["AX-X", "AX-Z", 300], ["AX-Y", "AX-Z", 100], ["AX-A", "AX-Z", 50], ["AX-B", "AX-Z", 30], ["AX-B", "AX-Z", -30],
  ["AX-Z", "AX-BT", 450],
];

/** The walk the provenance card used before: every path, fractions multiplied along each. */
function pathByPath(lotId: number, kind: "tank" | "polished") {
  return getSqlite()
    .prepare(
      `with recursive up(lot_id, frac) as (
        select ?, 1.0
        union all
        select e.parent_lot_id, up.frac * e.weight / c.content_in
        from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = up.lot_id
        where c.kind not in (?, 'harvest') and c.content_in > 0
      )
      select l.id, sum(up.frac) as fraction from up join lots l on l.id = up.lot_id
      where l.kind = ? group by l.id having abs(sum(up.frac)) > 1e-9 order by l.id`,
    )
    .all(lotId, kind, kind) as { id: number; fraction: number }[];
}

/** A bare event of `step`, by the latest event's user and party: what the tests below record around a lineage. */
function recordEvent(step: string): number {
  const db = getSqlite();
  const { user_id: user, party_id: party } = db.prepare("select user_id, party_id from events order by id desc limit 1").get() as { user_id: string; party_id: string };
  return Number(db.prepare("insert into events (step, at, recorded_at, user_id, party_id) values (?, 0, 0, ?, ?)").run(step, user, party).lastInsertRowid);
}

/** The lots the key dates are read for, as the provenance card's recursive read found them before. */
function datedLotsBySql(lotId: number) {
  const rows = getSqlite()
    .prepare(
      `with recursive up(lot_id) as (
        select ?
        union
        select e.parent_lot_id from up join lineage_edges e on e.child_lot_id = up.lot_id
        join lots c on c.id = up.lot_id where c.kind in ('bottled', 'blend', 'sake', 'tank')
      )
      select lot_id as id from up order by lot_id`,
    )
    .all(lotId) as { id: number }[];
  return rows.map((r) => r.id);
}

const idOf = (code: string) => (getSqlite().prepare("select id from lots where code = ?").get(code) as { id: number }).id;

beforeAll(() => {
  const db = getSqlite();
  const party = (db.prepare("select id from parties where kind = 'brewery' limit 1").get() as { id: string }).id;
  const user = (db.prepare("select id from users limit 1").get() as { id: string }).id;
  const event = db.prepare("insert into events (step, at, recorded_at, user_id, party_id) values ('blending', 0, 0, ?, ?)").run(user, party).lastInsertRowid;
  const lot = db.prepare("insert into lots (code, kind, unit, party_id, origin_party_id, polishing_ratio_pct, content_in, quantity_in, on_hand, created_at) values (?, ?, 'kg', ?, ?, ?, ?, ?, 0, 0)");
  for (const [code, kind, contentIn, ratio] of lots) lot.run(code, kind, party, party, ratio, contentIn, contentIn);
  const edge = db.prepare("insert into lineage_edges (event_id, parent_lot_id, child_lot_id, weight) values (?, ?, ?, ?)");
  for (const [parent, child, weight] of edges) edge.run(event, idOf(parent), idOf(child), weight);
});

describe("the walk of distinct lots behind a lot", () => {
  it("gives the lots and fractions of the path-by-path walk, from every lot of the fixture", () => {
    for (const [code] of lots) {
      const ancestry = ancestryOf(idOf(code));
      for (const kind of ["tank", "polished"] as const) {
        const expected = pathByPath(idOf(code), kind);
        const got = lotsOfKindUp(ancestry, idOf(code), kind);
        expect(got.map((l) => l.id), `${kind} behind ${code}`).toEqual(expected.map((l) => l.id));
        got.forEach((l, n) => expect(l.fraction).toBeCloseTo(expected[n]!.fraction, 12));
      }
    }
  });

  it("finds both tanks behind the bottling, and the corrected polished lot drops out", () => {
    const bottle = idOf("AX-BT");
    const ancestry = ancestryOf(bottle);
    expect(lotsOfKindUp(ancestry, bottle, "tank").map((l) => l.code)).toEqual(["AX-T1", "AX-T2"]);
    expect(lotsOfKindUp(ancestry, bottle, "polished").map((l) => l.code)).toEqual(["AX-P1", "AX-P2"]);
    // Z: X 300 (A 1/3, B 2/3), Y 100 (A 1/2, B 1/2), A 50 → A (100 + 50 + 50) / 450.
    expect(lotsOfKindUp(ancestry, bottle, "tank")[0]!.fraction).toBeCloseTo(200 / 450, 12);
  });

  it("gives each tank the koji share and least-polished rice of the path-by-path walks", () => {
    const claims = claimsForLot({ id: idOf("AX-BT"), code: "AX-BT", kind: "bottled" }, (key) => key);
    for (const tank of claims.tanks) {
      const ratios = pathByPath(idOf(tank.code), "polished").map((p) => lots.find(([c]) => idOf(c) === p.id)![3]!);
      expect(tank.polishingRatioPct).toBe(Math.max(...ratios));
      expect(tank.kojiRatioPct).toBeCloseTo(kojiFraction(idOf(tank.code)) * 100, 12);
    }
    expect(claims.tanks.map((t) => [t.code, t.polishingRatioPct])).toEqual([["AX-T1", 60], ["AX-T2", 60]]);
    expect(claims.tanks[1]!.kojiRatioPct).toBeCloseTo(20, 12);
  });

  it("finds the lots behind a lot through bottlings, blends, sake and tanks as the recursive read does", () => {
    for (const [code] of lots) {
      const got = lotsUpThrough(ancestryOf(idOf(code)), idOf(code), ["bottled", "blend", "sake", "tank"]);
      expect([...got!].sort((a, b) => a - b), `behind ${code}`).toEqual(datedLotsBySql(idOf(code)));
    }
    // The reversed link P3 → T2 is still an edge the read follows, as SQLite's walk does.
    expect(lotsUpThrough(ancestryOf(idOf("AX-BT")), idOf("AX-BT"), ["bottled", "blend", "sake", "tank"])).toContain(idOf("AX-P3"));
  });

  it("brings the lineage up to date once an event is recorded", () => {
    const db = getSqlite();
    const bottle = idOf("AX-BT");
    expect(lotsOfKindUp(ancestryOf(bottle), bottle, "polished").map((l) => l.code)).toEqual(["AX-P1", "AX-P2"]);
    // The corrected link is recorded once more, by a new event: AX-P3 is behind the bottle again.
    const event = recordEvent("mash-addition");
    db.prepare("insert into lineage_edges (event_id, parent_lot_id, child_lot_id, weight) values (?, ?, ?, 100)").run(event, idOf("AX-P3"), idOf("AX-T2"));
    const again = lotsOfKindUp(ancestryOf(bottle), bottle, "polished");
    expect(again.map((l) => l.code)).toEqual(["AX-P1", "AX-P2", "AX-P3"]);
    expect(again.map((l) => l.fraction)).toEqual(pathByPath(bottle, "polished").map((l) => expect.closeTo(l.fraction, 12)));
  });
  it("keeps a lineage while events touch other lots, and brings it up to date when one touches a lot in it", () => {
    const db = getSqlite();
    const bottle = idOf("AX-BT");
    const kept = ancestryOf(bottle).first;
    // Elsewhere on the floor: a new lot made from one outside the lineage, and a lot of it drawn.
    const { party_id: party } = db.prepare("select party_id from events order by id desc limit 1").get() as { party_id: string };
    const lot = db.prepare("insert into lots (code, kind, unit, party_id, origin_party_id, content_in, quantity_in, on_hand, created_at) values (?, ?, 'kg', ?, ?, 10, 10, 10, 0)");
    lot.run("AX-H9", "harvest", party, party);
    lot.run("AX-ELSE", "polished", party, party);
    const made = recordEvent("polishing");
    db.prepare("insert into event_outputs (event_id, lot_id, quantity, content) values (?, ?, 10, 10)").run(made, idOf("AX-ELSE"));
    db.prepare("insert into lineage_edges (event_id, parent_lot_id, child_lot_id, weight) values (?, ?, ?, 10)").run(made, idOf("AX-H9"), idOf("AX-ELSE"));
    db.prepare("insert into event_inputs (event_id, lot_id, quantity, content, use) values (?, ?, 1, 1, 'draw')").run(recordEvent("soaking"), idOf("AX-ELSE"));
    expect(ancestryOf(bottle).first, "kept across events on other lots").toBe(kept);
    // More comes out into a tank of the lineage (its content grows): the fractions change, and the lineage is brought up to date.
    const added = recordEvent("mash-addition");
    db.prepare("insert into event_outputs (event_id, lot_id, quantity, content) values (?, ?, 100, 100)").run(added, idOf("AX-T1"));
    db.prepare("update lots set content_in = content_in + 100 where code = 'AX-T1'").run();
    const grown = ancestryOf(bottle);
    expect(grown.first).not.toBe(kept);
    expect(lotsOfKindUp(grown, bottle, "polished").map((l) => l.fraction)).toEqual(pathByPath(bottle, "polished").map((l) => expect.closeTo(l.fraction, 12)));
    // A correction takes it back: it draws from the tank, and the lineage is brought up to date again.
    const correction = recordEvent("correcting");
    db.prepare("insert into event_inputs (event_id, lot_id, quantity, content, use) values (?, ?, 100, 100, 'draw')").run(correction, idOf("AX-T1"));
    db.prepare("update lots set content_in = content_in - 100 where code = 'AX-T1'").run();
    const back = ancestryOf(bottle);
    expect(back.first).not.toBe(grown.first);
    expect(lotsOfKindUp(back, bottle, "polished").map((l) => l.fraction)).toEqual(pathByPath(bottle, "polished").map((l) => expect.closeTo(l.fraction, 12)));
  });

  // What makes a lineage is its lots' kinds and contents and the edges into them: an event that
  // touches a lot of it without changing those (a shipment or a sample drawn from the bottle)
  // keeps it; an edge into one of its lots, or a content that moved, has it brought up to date
  // (tests/integration/ancestry-brought-up.test.ts holds that to a read anew).
  it("keeps a lineage an event touched without changing it, and brings it up to date when an edge or a content changes", () => {
    const db = getSqlite();
    const bottle = idOf("AX-BT");
    const read = ancestryOf(bottle).first;
    // Two cases shipped and a bottle opened for tasting: drawn from the bottling, nothing went into it.
    db.prepare("insert into event_inputs (event_id, lot_id, quantity, content, use) values (?, ?, 2, 2, 'move')").run(recordEvent("shipping"), bottle);
    db.prepare("insert into event_inputs (event_id, lot_id, quantity, content, use) values (?, ?, 1, 1, 'draw')").run(recordEvent("measuring"), bottle);
    db.prepare("update lots set on_hand = on_hand - 3 where id = ?").run(bottle);
    expect(ancestryOf(bottle).first, "kept across draws from the bottle").toBe(read);
    // An event that lists the bottle among its outputs but puts nothing into it: kept too.
    db.prepare("insert into event_outputs (event_id, lot_id, quantity, content) values (?, ?, 0, 0)").run(recordEvent("blending"), bottle);
    expect(ancestryOf(bottle).first, "kept across an output of nothing").toBe(read);
    // An edge into one of its lots, even of weight 0: brought up to date.
    const parent = (db.prepare("select parent_lot_id as p from lineage_edges where child_lot_id = ? limit 1").get(bottle) as { p: number }).p;
    db.prepare("insert into lineage_edges (event_id, parent_lot_id, child_lot_id, weight) values (?, ?, ?, 0)").run(recordEvent("blending"), parent, bottle);
    const linked = ancestryOf(bottle);
    expect(linked.first).not.toBe(read);
    expect(lotsOfKindUp(linked, bottle, "polished").map((l) => l.fraction)).toEqual(pathByPath(bottle, "polished").map((l) => expect.closeTo(l.fraction, 12)));
    // A content that moved, with no edge (as the bench's event that comes out into a lot): brought up to date.
    db.prepare("insert into event_outputs (event_id, lot_id, quantity, content) values (?, ?, 5, 5)").run(recordEvent("blending"), idOf("AX-T1"));
    db.prepare("update lots set content_in = content_in + 5 where code = 'AX-T1'").run();
    const moved = ancestryOf(bottle);
    expect(moved.first).not.toBe(linked.first);
    expect(lotsOfKindUp(moved, bottle, "polished").map((l) => l.fraction)).toEqual(pathByPath(bottle, "polished").map((l) => expect.closeTo(l.fraction, 12)));
    // Kept or brought up to date, the answer is the one a fresh read gives.
    expect(lotsOfKindUp(ancestryOf(bottle), bottle, "tank").map((l) => [l.id, l.fraction])).toEqual(pathByPath(bottle, "tank").map((l) => [l.id, expect.closeTo(l.fraction, 12)]));
  });

  it("checks what was touched since a lineage was read by the rows after the mark alone, never a scan of the tables", () => {
    const query = new SQLiteSyncDialect().sqlToQuery(touchedSince({ event: 1, edge: 1, attachment: 1 }));
    const plan = (getSqlite().prepare(`explain query plan ${query.sql}`).all(...query.params) as { detail: string }[]).map((r) => r.detail);
    expect(plan.filter((d) => /^SCAN (event_outputs|event_inputs|lineage_edges)\b/.test(d)), plan.join(" | ")).toEqual([]);
    expect(plan.some((d) => d.includes("event_outputs_event_idx"))).toBe(true);
  });
});
