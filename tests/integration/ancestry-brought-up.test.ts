import { beforeAll, describe, expect, it } from "vitest";
import { getSqlite } from "@/server/platform/db";
import { ancestryOf, ancestryReadAnew, fractionsUp, lotOf, type Ancestry, type Walk } from "@/server/trace/ancestry";
import { pick, seededRandom } from "../support/seeded-random";

// Lineages are read from an index of every edge in memory, loaded once and kept current from what
// the ledger records; a kept lineage is brought up to date from what was recorded since it was
// read (new edges into its lots, contents that moved). A read anew must give what SQLite itself
// gives, and whatever was recorded, a kept lineage must be the one a read anew gives:
// the same lots with the same kinds and contents, each lot's edges in the same order, and every
// walk over it the same to the last bit. A seeded random ledger in the layers of a brewery is
// changed 160 times by random events, and the kept lineages of its bottlings, a blend and a tank
// are held to a read anew after each.

const LAYERS = ["harvest", "polished", "koji", "steamed", "tank", "sake", "blend", "blend", "bottled"] as const;
const STOPS = [["tank"], ["polished"], ["koji", "polished"], []] as const;

type Lot = { id: number; layer: number };
const made: Lot[] = [];
let party = "";
let user = "";
const db = () => getSqlite();

function recordEvent(step: string): number {
  return Number(db().prepare("insert into events (step, at, recorded_at, user_id, party_id) values (?, 0, 0, ?, ?)").run(step, user, party).lastInsertRowid);
}

function newLot(layer: number, contentIn: number): Lot {
  const code = `AB-${layer}-${made.length}`;
  const id = Number(
    db()
      .prepare("insert into lots (code, kind, unit, party_id, origin_party_id, polishing_ratio_pct, content_in, quantity_in, on_hand, created_at) values (?, ?, 'kg', ?, ?, ?, ?, ?, 0, 0)")
      .run(code, LAYERS[layer], party, party, layer === 1 ? 50 + made.length % 3 * 10 : null, contentIn, contentIn).lastInsertRowid,
  );
  const lot = { id, layer };
  made.push(lot);
  return lot;
}

const link = (event: number, parent: Lot, child: Lot, weight: number) =>
  db().prepare("insert into lineage_edges (event_id, parent_lot_id, child_lot_id, weight) values (?, ?, ?, ?)").run(event, parent.id, child.id, weight);

/** A lot's content moved: out of an event (it grew) or drawn by a correction (it shrank), as the floor records it. */
function setContent(lot: Lot, contentIn: number) {
  const now = (db().prepare("select content_in as c from lots where id = ?").get(lot.id) as { c: number }).c;
  const event = recordEvent(contentIn >= now ? "mash-addition" : "correcting");
  const table = contentIn >= now ? "event_outputs (event_id, lot_id, quantity, content)" : "event_inputs (event_id, lot_id, quantity, content, use)";
  db().prepare(`insert into ${table} values (?, ?, ?, ?${contentIn >= now ? "" : ", 'draw'"})`).run(event, lot.id, Math.abs(contentIn - now), Math.abs(contentIn - now));
  db().prepare("update lots set content_in = ? where id = ?").run(contentIn, lot.id);
}

/** What makes a lineage, by lot id: positions may differ (a brought-up lineage puts the lots it finds after the others). */
function shape(a: Ancestry) {
  return [...a.ids.keys()]
    .map((n) => {
      const edges: [number, number][] = [];
      for (let e = a.first[n]!; e < a.first[n + 1]!; e++) edges.push([a.ids[a.parent[e]!]!, a.weight[e]!]);
      return { id: a.ids[n]!, kind: a.kinds[n]!, contentIn: a.contents[n]!, edges };
    })
    .sort((x, y) => x.id - y.id);
}

/**
 * The lineage read from SQLite itself, a step at a time: each lot once, the edges into a lot that
 * passes rice on (not a harvest lot, some content) in the child index's order, named here.
 * What the edge index, loaded once and patched since, must give.
 */
function shapeBySql(head: number) {
  const lotRow = db().prepare("select kind, content_in as contentIn from lots where id = ?");
  const edgesInto = db().prepare("select parent_lot_id as parent, weight from lineage_edges where child_lot_id = ? order by parent_lot_id, weight, id");
  const lots = new Map<number, { id: number; kind: string; contentIn: number; edges: [number, number][] }>();
  const todo = [head];
  for (let n = 0; n < todo.length; n++) {
    const id = todo[n]!;
    const { kind, contentIn } = lotRow.get(id) as { kind: string; contentIn: number };
    const edges: [number, number][] = [];
    if (kind !== "harvest" && contentIn > 0)
      for (const e of edgesInto.all(id) as { parent: number; weight: number }[]) {
        edges.push([e.parent, e.weight]);
        if (!todo.includes(e.parent)) todo.push(e.parent);
      }
    lots.set(id, { id, kind, contentIn, edges });
  }
  return [...lots.values()].sort((x, y) => x.id - y.id);
}

/** A walk's lots by id, in the order reached, with their fractions. */
const byId = (a: Ancestry, walk: Walk) => Array.from(walk.places, (n, i) => [a.ids[n]!, walk.shares[i]!]);

function expectSameAsReadAnew(head: Lot, context: string) {
  const kept = ancestryOf(head.id);
  const anew = ancestryReadAnew(head.id);
  const keptShape = shape(kept);
  expect(shape(anew), `${context}: read anew from the edge index, against SQLite`).toEqual(shapeBySql(head.id));
  expect(keptShape, context).toEqual(shape(anew));
  // Each lot's edges in the child index's order, as every read gives it: by parent, then weight.
  for (const lot of keptShape) expect(lot.edges, `${context}: edges into ${lot.id}`).toEqual([...lot.edges].sort((a, b) => a[0] - b[0] || a[1] - b[1]));
  expect([...kept.described].sort(), context).toEqual([...anew.described].sort());
  // Every walk, from every lot, bit for bit and in the same order (a kept walk is compared too).
  for (const id of anew.ids)
    for (const stop of STOPS) expect(byId(kept, fractionsUp(kept, id, stop)), `${context}: walk from ${id} to ${stop.join(",")}`).toEqual(byId(anew, fractionsUp(anew, id, stop)));
  return kept;
}


beforeAll(() => {
  party = (db().prepare("select id from parties where kind = 'brewery' limit 1").get() as { id: string }).id;
  user = (db().prepare("select id from users limit 1").get() as { id: string }).id;
  const next = seededRandom(20261203);
  const event = recordEvent("blending");
  const perLayer = [8, 8, 5, 4, 6, 6, 5, 3, 4];
  perLayer.forEach((count, layer) => {
    for (let i = 0; i < count; i++) {
      const lot = newLot(layer, layer === 0 ? 1000 : 100 + Math.floor(next() * 400));
      if (layer === 0) continue;
      const below = made.filter((l) => l.layer < layer && l.layer >= Math.max(0, layer - 2));
      for (let k = 0; k < 2 + Math.floor(next() * 3); k++) link(event, pick(next, below), lot, 10 + Math.floor(next() * 200));
    }
  });
});

describe("a kept lineage brought up to date", () => {
  it("keeps the walks over lots an edge into the bottling did not change, and gives what a read anew gives", () => {
    const bottle = made.find((l) => l.layer === 8)!;
    const before = ancestryOf(bottle.id);
    const tank = before.ids.find((id) => lotOf(before, id)!.kind === "tank")!;
    const tankWalk = fractionsUp(before, tank, ["polished"]);
    const bottleWalk = fractionsUp(before, bottle.id, ["tank"]);
    const parent = before.ids[before.parent[before.first[0]!]!]!;
    db().prepare("insert into lineage_edges (event_id, parent_lot_id, child_lot_id, weight) values (?, ?, ?, 0)").run(recordEvent("blending"), parent, bottle.id);
    const after = expectSameAsReadAnew(bottle, "a weight-0 edge into the bottling");
    expect(after.first, "brought up, not kept as it was").not.toBe(before.first);
    expect(after.walks.get(`${tank}:polished`), "the tank's walk kept").toBe(tankWalk);
    expect(fractionsUp(after, bottle.id, ["tank"]), "the bottling's own walk made again").not.toBe(bottleWalk);
  });

  it("gives what a read anew gives after each of 160 random events, most of them brought up rather than read anew", () => {
    const next = seededRandom(7);
    const heads = [...made.filter((l) => l.layer === 8), made.filter((l) => l.layer === 7)[0]!, made.filter((l) => l.layer === 4)[0]!];
    const last = new Map(heads.map((head) => [head.id, expectSameAsReadAnew(head, "first read").first]));
    const counts = { changed: 0, broughtUp: 0 };
    for (let step = 0; step < 160; step++) {
      const r = next();
      let what: string;
      if (r < 0.3) {
        // A link into a lot from one below it, of any weight, or the reversal of one recorded.
        const child = pick(next, made.filter((l) => l.layer > 0));
        const parent = pick(next, made.filter((l) => l.layer < child.layer));
        const weight = next() < 0.2 ? 0 : next() < 0.3 ? -(10 + Math.floor(next() * 50)) : 1 + Math.floor(next() * 300);
        link(recordEvent("blending"), parent, child, weight);
        what = `edge ${parent.id} → ${child.id} (${weight})`;
      } else if (r < 0.5) {
        // A content that grew or shrank, or went to nothing, or came back.
        const lot = pick(next, made.filter((l) => l.layer > 0));
        const c = next() < 0.15 ? 0 : 50 + Math.floor(next() * 500);
        setContent(lot, c);
        what = `content of ${lot.id} to ${c}`;
      } else if (r < 0.7) {
        // A lot made from lots below it, then linked into one above it: new lots join the lineage.
        const layer = 1 + Math.floor(next() * 7);
        const event = recordEvent("blending");
        const lot = newLot(layer, 100 + Math.floor(next() * 300));
        for (let k = 0; k < 1 + Math.floor(next() * 3); k++) link(event, pick(next, made.filter((l) => l.layer < layer)), lot, 20 + Math.floor(next() * 100));
        const above = made.filter((l) => l.layer > layer);
        if (above.length) link(recordEvent("blending"), lot, pick(next, above), 5 + Math.floor(next() * 50));
        what = `new lot ${lot.id}`;
      } else if (r < 0.85) {
        // A draw from a lot (a shipment, a sample): nothing in any lineage changes.
        const lot = pick(next, made);
        db().prepare("insert into event_inputs (event_id, lot_id, quantity, content, use) values (?, ?, 1, 1, 'draw')").run(recordEvent("shipping"), lot.id);
        what = `draw from ${lot.id}`;
      } else {
        // Two events at once: an edge and a content, before anyone looks.
        const child = pick(next, made.filter((l) => l.layer > 1));
        link(recordEvent("blending"), pick(next, made.filter((l) => l.layer < child.layer)), child, 1 + Math.floor(next() * 100));
        setContent(pick(next, made.filter((l) => l.layer > 0)), 40 + Math.floor(next() * 400));
        what = `edge into ${child.id} and a content`;
      }
      for (const head of heads) {
        const now = ancestryOf(head.id);
        // A lineage read anew has no walks yet; one brought up keeps those over lots that did not change.
        const carried = now.walks.size;
        expectSameAsReadAnew(head, `step ${step}, ${what}, lineage of ${head.id}`);
        if (now.first !== last.get(head.id)) counts.changed++, (counts.broughtUp += carried > 0 ? 1 : 0);
        last.set(head.id, now.first);
      }
    }
    expect(counts.changed).toBeGreaterThan(100);
    expect(counts.broughtUp / counts.changed).toBeGreaterThan(0.5);
  });

  // A bottling checks the claims of the sake it bottles inside its own write: what that reads may
  // be rolled back, and an edge id rolled back is given again to the next edge recorded.
  it("reads a caller's uncommitted edges inside its transaction and keeps none of them once it is rolled back", () => {
    const bottle = made.filter((l) => l.layer === 8)[1]!;
    const parent = made.find((l) => l.layer === 5)!;
    const shapeNow = () => shape(ancestryOf(bottle.id));
    expect(shapeNow()).toEqual(shapeBySql(bottle.id));
    let inside: ReturnType<typeof shape> = [];
    let expected: ReturnType<typeof shapeBySql> = [];
    const write = db().transaction(() => {
      link(recordEvent("blending"), parent, bottle, 77);
      [inside, expected] = [shapeNow(), shapeBySql(bottle.id)];
      throw new Error("rolled back");
    });
    expect(() => write()).toThrow("rolled back");
    expect(inside, "the transaction's own edge read inside it").toEqual(expected);
    expect(inside.find((l) => l.id === bottle.id)!.edges).toContainEqual([parent.id, 77]);
    // Rolled back: gone from the lineage; the next edge recorded takes the same id and is read.
    expect(shapeNow(), "after the rollback").toEqual(shapeBySql(bottle.id));
    expect(shapeNow().find((l) => l.id === bottle.id)!.edges).not.toContainEqual([parent.id, 77]);
    link(recordEvent("blending"), parent, bottle, 33);
    expect(shapeNow(), "after the next edge").toEqual(shapeBySql(bottle.id));
    expect(shape(ancestryReadAnew(bottle.id))).toEqual(shapeBySql(bottle.id));
  });
});
