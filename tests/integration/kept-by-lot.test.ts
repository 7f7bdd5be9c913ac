import { beforeAll, describe, expect, it } from "vitest";
import { getSqlite } from "@/server/platform/db";
import { ancestryOf, ancestryReadAnew, fractionsUp, lotsOfKindUp, type Ancestry } from "@/server/trace/ancestry";
import { claimedCategories } from "@/server/trace/claims";
import { provenanceOf } from "@/server/trace/provenance";
import { tankFactsJudgedAnew, tankFactsOf } from "@/server/trace/tank-facts";
import { pick, seededRandom } from "../support/seeded-random";

// A tank's category facts, a lot's key dates and a lot's fixed details are kept across requests
// and lineages, each dropped when a row recorded since names a lot it rests on. Whatever is
// recorded, what is kept must be what working it out anew gives. A seeded random ledger in the
// layers of a brewery (harvest lots graded, some "equivalent"; tanks with composition rows) is
// changed 200 times in the ways the floor and the office change it: edges, contents, mash
// additions and their corrections, alcohol readings and their corrections (which write no input
// or output row), certificates attached, composition rows, draws. After each, the provenance
// answer and every tank's facts for five heads are held to the same worked out anew, with
// nothing kept; and the kept facts must have been kept (not worked out anew every time).

const LAYERS = ["harvest", "polished", "koji", "steamed", "tank", "sake", "blend", "blend", "bottled"] as const;
const GRADES = ["1", "2", "3", "equivalent", "equivalent", null] as const;

type Lot = { id: number; layer: number };
const made: Lot[] = [];
/** Mash additions not yet corrected: correcting a tank's first moves its brewing date. */
const mashAdditions: number[] = [];
let party = "";
let user = "";
let clock = Date.UTC(2026, 9, 1);
const db = () => getSqlite();

function recordEvent(step: string, corrects: number | null = null): number {
  clock += 3_600_000;
  return Number(db().prepare("insert into events (step, at, recorded_at, user_id, party_id, corrects) values (?, ?, ?, ?, ?, ?)").run(step, clock, clock, user, party, corrects).lastInsertRowid);
}

function newLot(layer: number, contentIn: number, next: () => number): Lot {
  const code = `KB-${layer}-${made.length}`;
  const grade = layer === 0 ? pick(next, [...GRADES]) : null;
  const attributes = layer === 4 ? JSON.stringify({ ginjoMethod: next() < 0.5 }) : "{}";
  const id = Number(
    db()
      .prepare("insert into lots (code, kind, unit, party_id, origin_party_id, grade, polishing_ratio_pct, attributes, content_in, quantity_in, on_hand, created_at) values (?, ?, 'kg', ?, ?, ?, ?, ?, ?, ?, ?, 0)")
      .run(code, LAYERS[layer], party, party, grade, layer === 1 ? 40 + (made.length % 4) * 10 : null, attributes, contentIn, contentIn, contentIn).lastInsertRowid,
  );
  const lot = { id, layer };
  made.push(lot);
  return lot;
}

const link = (event: number, parent: Lot, child: Lot, weight: number) =>
  db().prepare("insert into lineage_edges (event_id, parent_lot_id, child_lot_id, weight) values (?, ?, ?, ?)").run(event, parent.id, child.id, weight);
const output = (event: number, lot: Lot, amount: number) => db().prepare("insert into event_outputs (event_id, lot_id, quantity, content) values (?, ?, ?, ?)").run(event, lot.id, amount, amount);
const contentOf = (lot: Lot) => (db().prepare("select content_in as c from lots where id = ?").get(lot.id) as { c: number }).c;

/** A mash addition into a tank, as the floor records it: its output, its edges and its composition rows from a harvest lot. */
function mashAddition(tank: Lot, next: () => number): number {
  const event = recordEvent("mash-addition");
  const kg = 20 + Math.floor(next() * 200);
  output(event, tank, kg);
  link(event, pick(next, made.filter((l) => l.layer === 2 || l.layer === 3)), tank, kg);
  db().prepare("insert into lot_source_deltas (event_id, lot_id, source_lot_id, amount) values (?, ?, ?, ?)").run(event, tank.id, pick(next, made.filter((l) => l.layer === 0)).id, kg);
  db().prepare("update lots set content_in = content_in + ?, quantity_in = quantity_in + ?, on_hand = on_hand + ? where id = ?").run(kg, kg, kg, tank.id);
  return event;
}

/** A correction of an event that made something: each output drawn back (as corrections.ts takes outputs back), its edges and composition reversed. */
function correct(original: number) {
  const event = recordEvent("correcting", original);
  for (const o of db().prepare("select lot_id as lot, content from event_outputs where event_id = ?").all(original) as { lot: number; content: number }[]) {
    db().prepare("insert into event_inputs (event_id, lot_id, quantity, content, use) values (?, ?, ?, ?, 'draw')").run(event, o.lot, o.content, o.content);
    db().prepare("update lots set content_in = content_in - ?, quantity_in = quantity_in - ?, on_hand = on_hand - ? where id = ?").run(o.content, o.content, o.content, o.lot);
  }
  db().prepare("insert into lineage_edges (event_id, parent_lot_id, child_lot_id, weight) select ?, parent_lot_id, child_lot_id, -weight from lineage_edges where event_id = ?").run(event, original);
  db().prepare("insert into lot_source_deltas (event_id, lot_id, source_lot_id, amount) select ?, lot_id, source_lot_id, -amount from lot_source_deltas where event_id = ?").run(event, original);
}

/** Brewing alcohol read on a tank: an observing input and the two readings (as writeMeasurements writes them). */
function alcoholReading(tank: Lot, next: () => number): number {
  const event = recordEvent("measuring");
  db().prepare("insert into event_inputs (event_id, lot_id, quantity, content, use) values (?, ?, 0, 0, 'observe')").run(event, tank.id);
  const reading = db().prepare("insert into measurements (event_id, lot_id, name, value, unit) values (?, ?, ?, ?, ?)");
  reading.run(event, tank.id, "addedAlcoholKg", 5 + Math.floor(next() * 40), "kg");
  reading.run(event, tank.id, "addedAlcoholStrengthPct", pick(next, [30, 60, 95]), "%");
  return event;
}

/** The ids of the lots a walk from `start` up to its polished rice reached. */
const fractionsUpIds = (a: Ancestry, start: number) => Array.from(fractionsUp(a, start, ["polished"]).places, (n) => a.ids[n]!);

/** The provenance answer and the tanks' facts of a head, from what is kept or worked out anew with nothing kept. */
function answers(head: Lot, ancestry: Ancestry, anew: boolean) {
  const row = db().prepare("select id, code, kind, content_in as contentIn from lots where id = ?").get(head.id) as { id: number; code: string; kind: string; contentIn: number };
  const tanks = lotsOfKindUp(ancestry, head.id, "tank");
  const facts = anew ? tankFactsJudgedAnew(tanks, ancestry) : tankFactsOf(tanks, ancestry);
  return { provenance: provenanceOf(row, claimedCategories(head.id, ancestry), ancestry), facts };
}

beforeAll(() => {
  party = (db().prepare("select id from parties where kind = 'brewery' limit 1").get() as { id: string }).id;
  user = (db().prepare("select id from users limit 1").get() as { id: string }).id;
  const next = seededRandom(20261204);
  const event = recordEvent("blending");
  [8, 8, 5, 4, 6, 6, 5, 3, 4].forEach((count, layer) => {
    for (let i = 0; i < count; i++) {
      const lot = newLot(layer, layer === 0 ? 1000 : 100 + Math.floor(next() * 400), next);
      if (layer === 0) continue;
      const below = made.filter((l) => l.layer < layer && l.layer >= Math.max(0, layer - 2));
      for (let k = 0; k < 2 + Math.floor(next() * 3); k++) link(event, pick(next, below), lot, 10 + Math.floor(next() * 200));
      if (layer === 4) mashAdditions.push(mashAddition(lot, next));
      if (layer >= 5) output(recordEvent(layer === 5 ? "pressing" : layer === 8 ? "bottling" : "blending"), lot, 1);
    }
  });
});

describe("figures kept across lineages", () => {
  // First, on the ledger as seeded: the random events below change it past reading by hand.
  it("drops a tank's facts when rice is added to a lot behind it, though no row names the tank", () => {
    const head = made.filter((l) => l.layer === 8)[2]!;
    const ancestry = ancestryOf(head.id);
    const tanks = lotsOfKindUp(ancestry, head.id, "tank");
    // A steamed lot that a tank behind the head drew from, with content to pass on.
    const tank = tanks.find((t) => fractionsUpIds(ancestry, t.id).some((id) => made.find((l) => l.id === id)?.layer === 3 && contentOf({ id, layer: 3 }) > 0))!;
    const steamed = fractionsUpIds(ancestry, tank.id).find((id) => made.find((l) => l.id === id)?.layer === 3 && contentOf({ id, layer: 3 }) > 0)!;
    const before = tankFactsOf(tanks, ancestry).get(tank.id)!;
    // Koji mixed into that steamed rice: an edge into it and its content grown, by one event.
    const event = recordEvent("steaming");
    link(event, made.find((l) => l.layer === 2)!, { id: steamed, layer: 3 }, 150);
    output(event, { id: steamed, layer: 3 }, 150);
    db().prepare("update lots set content_in = content_in + 150 where id = ?").run(steamed);
    const now = ancestryOf(head.id);
    const after = tankFactsOf(lotsOfKindUp(now, head.id, "tank"), now).get(tank.id)!;
    const anew = { ...ancestryReadAnew(head.id), mark: null };
    expect(after.kojiRatioPct, "more of the tank's rice passed through koji").toBeGreaterThan(before.kojiRatioPct!);
    expect(after).toEqual(tankFactsJudgedAnew(lotsOfKindUp(anew, head.id, "tank"), anew).get(tank.id));
  });

  it("are what working them out anew gives after each of 200 random events, and most are kept", () => {
    const next = seededRandom(11);
    const heads = [...made.filter((l) => l.layer === 8), made.filter((l) => l.layer === 7)[0]!];
    const readings: number[] = [];
    const seen = new Map<number, object>();
    const counts = { kept: 0, workedAgain: 0, datesMoved: 0 };
    const dates = new Map<number, string>();
    for (let step = 0; step < 200; step++) {
      const r = next();
      const tank = pick(next, made.filter((l) => l.layer === 4));
      let what: string;
      if (r < 0.15) {
        const child = pick(next, made.filter((l) => l.layer > 0));
        const parent = pick(next, made.filter((l) => l.layer < child.layer));
        const weight = next() < 0.2 ? 0 : next() < 0.3 ? -(10 + Math.floor(next() * 50)) : 1 + Math.floor(next() * 300);
        link(recordEvent("blending"), parent, child, weight);
        what = `edge ${parent.id} → ${child.id} (${weight})`;
      } else if (r < 0.3) {
        mashAdditions.push(mashAddition(tank, next));
        what = `mash addition into ${tank.id}`;
      } else if (r < 0.4 && mashAdditions.length) {
        const original = mashAdditions.splice(Math.floor(next() * mashAdditions.length), 1)[0]!;
        correct(original);
        what = `correction of mash addition ${original}`;
      } else if (r < 0.52) {
        readings.push(alcoholReading(tank, next));
        what = `alcohol read on ${tank.id}`;
      } else if (r < 0.62 && readings.length) {
        // Correcting a reading writes the correcting event alone: no input, no output.
        const original = readings.splice(Math.floor(next() * readings.length), 1)[0]!;
        recordEvent("correcting", original);
        what = `correction of reading ${original}`;
      } else if (r < 0.72) {
        const harvest = pick(next, made.filter((l) => l.layer === 0));
        db().prepare("insert into attachments (lot_id, sha256, file_name, content_type, size, title, user_id, created_at) values (?, 'ab', 'certificate.pdf', 'application/pdf', 1, 'Certificate', ?, 0)").run(harvest.id, user);
        what = `certificate on ${harvest.id}`;
      } else if (r < 0.8) {
        // Rice polished for a koji lot that a tank drew from: the tank's koji share moves, not the tank.
        const koji = pick(next, made.filter((l) => l.layer === 2));
        const event = recordEvent("koji-making");
        link(event, pick(next, made.filter((l) => l.layer === 1)), koji, 30 + Math.floor(next() * 100));
        output(event, koji, 30);
        db().prepare("update lots set content_in = content_in + 30 where id = ?").run(koji.id);
        what = `more rice into koji ${koji.id}`;
      } else if (r < 0.9) {
        const lot = pick(next, made);
        db().prepare("insert into event_inputs (event_id, lot_id, quantity, content, use) values (?, ?, 1, 1, 'draw')").run(recordEvent("shipping"), lot.id);
        what = `draw from ${lot.id}`;
      } else {
        // A new bottling of a blend: a new head whose tanks were judged for the others.
        const blend = pick(next, made.filter((l) => l.layer === 7));
        const event = recordEvent("bottling");
        const bottle = newLot(8, 50, next);
        link(event, blend, bottle, 50);
        output(event, bottle, 50);
        heads.push(bottle);
        what = `new bottling ${bottle.id} of ${blend.id} (content ${contentOf(blend)})`;
      }
      for (const head of heads) {
        const kept = answers(head, ancestryOf(head.id), false);
        const anew = answers(head, { ...ancestryReadAnew(head.id), mark: null }, true);
        expect(kept.provenance, `step ${step}, ${what}: provenance of ${head.id}`).toEqual(anew.provenance);
        expect(kept.facts, `step ${step}, ${what}: tanks behind ${head.id}`).toEqual(anew.facts);
        const brewed = kept.provenance.brewedOn.join();
        if (dates.has(head.id) && dates.get(head.id) !== brewed) counts.datesMoved++;
        dates.set(head.id, brewed);
        for (const [id, facts] of kept.facts) {
          if (seen.get(id) === facts) counts.kept++;
          else counts.workedAgain++;
          seen.set(id, facts);
        }
      }
    }
    // Not vacuous: the answers cover tanks, dates and categories, and most facts were kept.
    expect(counts.workedAgain).toBeGreaterThan(50);
    expect(counts.datesMoved).toBeGreaterThan(5);
    expect(counts.kept / (counts.kept + counts.workedAgain)).toBeGreaterThan(0.7);
  });

  it("keeps nothing read inside a caller's transaction that is rolled back", () => {
    const head = made.filter((l) => l.layer === 8)[0]!;
    const tanks = () => lotsOfKindUp(ancestryOf(head.id), head.id, "tank");
    const tank = made.find((l) => l.layer === 4 && tanks().some((t) => t.id === l.id))!;
    const before = tankFactsOf(tanks(), ancestryOf(head.id)).get(tank.id)!;
    let inside: typeof before | undefined;
    const write = db().transaction(() => {
      alcoholReading(tank, () => 0.5);
      inside = tankFactsOf(tanks(), ancestryOf(head.id)).get(tank.id);
      throw new Error("rolled back");
    });
    expect(() => write()).toThrow("rolled back");
    expect(inside!.addedAlcoholKg, "the transaction's own reading counted inside it").toBeGreaterThan(before.addedAlcoholKg);
    // Rolled back: the reading is gone, and so are the facts worked out from it.
    const after = tankFactsOf(tanks(), ancestryOf(head.id)).get(tank.id)!;
    expect(after).toEqual(before);
    const ancestry = { ...ancestryReadAnew(head.id), mark: null };
    expect(after).toEqual(tankFactsJudgedAnew(lotsOfKindUp(ancestry, head.id, "tank"), ancestry).get(tank.id));
  });
});
