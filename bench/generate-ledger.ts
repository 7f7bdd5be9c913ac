/**
 * A synthetic ledger for the trace benchmark: N seasons of an invented mid-size brewery,
 * written through the app's own write path (registerHarvestInTx, applyEvent) so that the
 * lots, lineage edges and composition rows are exactly what the app would have stored.
 *
 *   tsx --conditions=react-server bench/generate-ledger.ts --seasons 10
 *
 * Shapes per season (BREWERY): ~230 harvest lots from 50 growers' fields; ~150 polishing runs
 * merging 2–4 harvest lots; ~140 tanks, each with soak batches, a koji steaming split into four
 * koji batches, two mash steamings split into starter and addition portions, a starter,
 * three additions and a pressing into three fractions and lees; assembly blends of tank
 * fractions filled into several storage tanks; house blends of those blends (with aged
 * stock of earlier seasons); bottlings. Weights follow common practice (koji rice about a
 * fifth of the rice, additions growing about 1 : 2 : 4). Every name and number is made up.
 * Blending carries most of the lineage edges (inputs × storage tanks filled): that density is
 * what brings 10 seasons past 250,000 edges, and it is on the heavy side of practice on purpose.
 */
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
import type { DbOrTx } from "@/db/client";
import { gtinCheckDigit } from "@/domain/gtin";
import type { EventInput } from "@/lib/validation/events";
import type { Translate } from "@/lib/validation/field-errors";
import type { SessionUser } from "@/server/accounts/session";

export type Range = readonly [number, number];
export type Shape = {
  growers: number; fieldsPerGrower: Range; harvestsPerField: Range; brownKg: Range;
  polishInputs: Range; soaksKoji: Range; soaksMash: Range; tankRiceScale: number;
  /** How many assembly blends draw on each tank fraction, their inputs and storage tanks filled. */
  drawsPerFraction: number; blendInputs: Range; blendOutputs: Range;
  houseBlends: number; houseInputs: Range; houseOutputs: Range; agedStockChance: number;
  correctionsPerSeason: number;
};

export const BREWERY: Shape = {
  growers: 50, fieldsPerGrower: [2, 4], harvestsPerField: [1, 2], brownKg: [600, 2400],
  polishInputs: [2, 4], soaksKoji: [4, 8], soaksMash: [6, 12], tankRiceScale: 1,
  drawsPerFraction: 5, blendInputs: [24, 44], blendOutputs: [6, 12],
  houseBlends: 16, houseInputs: [8, 20], houseOutputs: [2, 4], agedStockChance: 0.5,
  correctionsPerSeason: 2,
};

/** A few tanks and blends: what the generator test runs in seconds. */
export const TINY: Shape = {
  growers: 4, fieldsPerGrower: [1, 2], harvestsPerField: [1, 1], brownKg: [900, 1500],
  polishInputs: [2, 3], soaksKoji: [2, 3], soaksMash: [2, 4], tankRiceScale: 0.5,
  drawsPerFraction: 2, blendInputs: [2, 4], blendOutputs: [1, 3],
  houseBlends: 2, houseInputs: [2, 3], houseOutputs: [1, 2], agedStockChance: 1,
  correctionsPerSeason: 1,
};

/** Mulberry32: a small seeded PRNG, so the same seed gives the same ledger. */
export function seededRandom(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const between = (r: Range) => r[0] + next() * (r[1] - r[0]);
  const int = (r: Range) => Math.floor(r[0] + next() * (r[1] - r[0] + 1));
  const pick = <T,>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)]!;
  const sample = <T,>(xs: readonly T[], n: number): T[] => {
    const copy = [...xs];
    for (let i = copy.length - 1; i > 0; i--) {
      const j = Math.floor(next() * (i + 1));
      [copy[i], copy[j]] = [copy[j]!, copy[i]!];
    }
    return copy.slice(0, n);
  };
  return { next, between, int, pick, sample };
}
export type Rng = ReturnType<typeof seededRandom>;

export type LedgerCounts = {
  seasons: number; lots: number; edges: number; compositionRows: number; events: number;
  lotsByKind: Record<string, number>; blendsOfBlends: number; seconds: number;
};

const r1 = (x: number) => Math.round(x * 10) / 10;
const r3 = (x: number) => Math.round(x * 1000) / 1000;
const VARIETIES = ["Yamada Nishiki", "Omachi", "Gohyakumangoku", "Miyama Nishiki", "Hattan Nishiki"];
const REGIONS = ["Hyogo", "Okayama", "Niigata", "Nagano", "Hiroshima"];
/** Product classes by polishing target (%), with the rice of one tank (kg) and a GTIN base. */
const CLASSES = [
  { target: 40, weight: 0.12, tankRice: [500, 800] as Range, gtin: "950600020" },
  { target: 50, weight: 0.23, tankRice: [800, 1400] as Range, gtin: "950600021" },
  { target: 60, weight: 0.35, tankRice: [1200, 2000] as Range, gtin: "950600022" },
  { target: 70, weight: 0.3, tankRice: [1600, 2600] as Range, gtin: "950600023" },
];
/** Composition rows one event may write: under SQLite's 32,766 bound variables at 4 a row. */
const MAX_DELTA_ROWS = 6000;

type Api = {
  applyEvent: typeof import("@/server/ledger/events").applyEvent;
  registerHarvestInTx: typeof import("@/server/ledger/harvests").registerHarvestInTx;
};
type Recorded = { id: number; outputs: { code: string; kind: string; quantity: number }[] };
type Input = Partial<EventInput> & { step: EventInput["step"] };
type Stock = { code: string; left: number; cls: number; season: number };

/** Records events in the caller's transaction and keeps on-hand figures beside them. */
class Floor {
  tx!: DbOrTx;
  readonly onHand = new Map<string, number>();
  constructor(private api: Api, private t: Translate) {}

  record(actor: SessionUser, input: Input): Recorded {
    const full = { inputs: [], outputs: [], measurements: [], ...input } as EventInput;
    const result = this.api.applyEvent(this.tx, actor, full, this.t) as Recorded;
    if (full.step !== "receiving" && full.step !== "shipping" && full.step !== "measuring") {
      for (const i of full.inputs) this.onHand.set(i.lot, this.onHand.get(i.lot)! - i.quantity);
    }
    for (const o of result.outputs) this.onHand.set(o.code, (this.onHand.get(o.code) ?? 0) + o.quantity);
    return result;
  }

  harvest(actor: SessionUser, input: Parameters<Api["registerHarvestInTx"]>[2]): string {
    const { code } = this.api.registerHarvestInTx(this.tx, actor, input, this.t);
    this.onHand.set(code, input.brownKg);
    return code;
  }

  /** All of a lot, as the floor draws it when a batch is used up. */
  all(code: string) {
    return { lot: code, quantity: this.onHand.get(code)! };
  }
}

const at = (year: number, month: number, day: number, plusDays = 0, hour = 9) =>
  new Date(Date.UTC(year, month - 1, day + plusDays, hour - 9)).toISOString().replace("Z", "+00:00");
const m = (name: string, value: number, unit: string) => ({ name, value: r1(value), unit });

export function ledgerFile(seasons: number, dir = path.join(import.meta.dirname, ".data")): string {
  return path.join(dir, `ledger-${seasons}s-v2.db`);
}

/**
 * Generates `seasons` seasons into a fresh SQLite file (migrations applied). Uses the app's
 * one connection (getDb), so GRAINLINE_DB is pointed at `file` before src/server loads.
 */
export async function generateLedger(file: string, opts: { seasons: number; shape?: Shape; seed?: number; log?: (line: string) => void }): Promise<LedgerCounts> {
  const started = performance.now();
  const shape = opts.shape ?? BREWERY;
  const log = opts.log ?? (() => {});
  for (const suffix of ["", "-wal", "-shm"]) rmSync(file + suffix, { force: true });
  process.env.GRAINLINE_DB = file;
  const { getDb, getSqlite } = await import("@/server/platform/db");
  if (path.resolve(getSqlite().name) !== path.resolve(file)) throw new Error(`getDb() is bound to ${getSqlite().name}, not ${file}`);
  const { migrateDatabase } = await import("@/db/client");
  const { fields, parties, users } = await import("@/db/schema");
  const { applyEvent } = await import("@/server/ledger/events");
  const { registerHarvestInTx } = await import("@/server/ledger/harvests");
  const { translator } = await import("@/i18n/messages");
  const en = translator("en");
  const t: Translate = (key, values) => en(key as never, values as never);

  const db = getDb();
  migrateDatabase(db);
  const rng = seededRandom(opts.seed ?? 20260401);
  const now = new Date(Date.UTC(2026, 3, 1));
  const growerIds = Array.from({ length: shape.growers }, (_, n) => `bench-grower-${String(n + 1).padStart(3, "0")}`);
  const fieldRows = growerIds.flatMap((growerId, g) =>
    Array.from({ length: rng.int(shape.fieldsPerGrower) }, (_, n) => ({
      id: `${growerId}-f${n + 1}`, growerId, name: `Paddy ${g + 1}-${n + 1}`, region: REGIONS[g % REGIONS.length]!,
      areaHa: r1(rng.between([0.5, 3.5])), variety: rng.pick(VARIETIES), createdAt: now,
    })),
  );
  const office: SessionUser = { id: "bench-office", email: "office@bench.example", name: "Bench Office", role: "admin", partyId: "bench-brewery" };
  const miller: SessionUser = { id: "bench-miller", email: "mill@bench.example", name: "Bench Miller", role: "miller", partyId: "bench-mill" };
  const brewer: SessionUser = { id: "bench-brewer", email: "floor@bench.example", name: "Bench Brewer", role: "brewer", partyId: "bench-brewery" };
  db.transaction((tx) => {
    tx.insert(parties).values([
      { id: "bench-brewery", kind: "brewery", name: "Bench Brewery", createdAt: now },
      { id: "bench-mill", kind: "mill", name: "Bench Polishing Mill", createdAt: now },
      ...growerIds.map((id, n) => ({ id, kind: "grower" as const, name: `Grower ${n + 1}`, region: REGIONS[n % REGIONS.length]!, createdAt: now })),
    ]).run();
    tx.insert(users).values([office, miller, brewer].map((u) => ({ ...u, createdAt: now }))).run();
    tx.insert(fields).values(fieldRows.map(({ variety: _v, ...f }) => f)).run();
  });

  const floor = new Floor({ applyEvent, registerHarvestInTx }, t);
  const inTx = <T,>(work: () => T): T =>
    db.transaction((tx) => {
      floor.tx = tx;
      return work();
    }, { behavior: "immediate" });
  const sourcesOf = getSqlite().prepare(
    "select count(distinct d.source_lot_id) as n from lot_source_deltas d join lots l on l.id = d.lot_id join json_each(?) j on j.value = l.code",
  );
  const capOutputs = (codes: string[], wanted: number) => {
    const n = (sourcesOf.get(JSON.stringify(codes)) as { n: number }).n;
    return Math.max(1, Math.min(wanted, Math.floor(MAX_DELTA_ROWS / Math.max(1, n))));
  };
  const aged: Stock[] = [];
  const ctx = { shape, rng, floor, inTx, office, miller, brewer, fieldRows, capOutputs, aged };
  for (let season = 0; season < opts.seasons; season++) {
    const s0 = performance.now();
    generateSeason(ctx, season);
    log(`season ${season + 1}/${opts.seasons}: ${((performance.now() - s0) / 1000).toFixed(1)} s`);
  }
  getSqlite().pragma("wal_checkpoint(TRUNCATE)");
  return { ...countLedger(getSqlite()), seasons: opts.seasons, seconds: (performance.now() - started) / 1000 };
}

type Ctx = {
  shape: Shape; rng: Rng; floor: Floor; inTx: <T>(work: () => T) => T;
  office: SessionUser; miller: SessionUser; brewer: SessionUser;
  fieldRows: { id: string; growerId: string; variety: string }[];
  capOutputs: (codes: string[], wanted: number) => number; aged: Stock[];
};

function generateSeason(c: Ctx, season: number) {
  const year = 2016 + season;
  const polished = harvestAndPolish(c, year);
  const fractions = brew(c, year, season, polished);
  const storage = assemble(c, year, season, fractions);
  const house = houseBlends(c, year, season, storage);
  bottle(c, year, [...house, ...storage], fractions);
  c.aged.push(...house);
}

/** Harvests by field, delivery to the mill, polishing runs of 2–4 lots of one variety, receipt at the brewery. */
function harvestAndPolish(c: Ctx, year: number): Stock[][] {
  const { rng, floor, shape } = c;
  const byVariety = new Map<string, Stock[]>();
  c.inTx(() => {
    const byGrower = new Map<string, string[]>();
    for (const f of c.fieldRows) {
      for (let n = rng.int(shape.harvestsPerField); n > 0; n--) {
        const bags = Math.round(rng.between(shape.brownKg) / 30);
        const grade = rng.pick(["tokuto", "1", "1", "2", "2", "3"] as const);
        const code = floor.harvest(c.office, { fieldId: f.id, variety: f.variety, cropYear: year, brownKg: bags * 30, moisturePct: r1(rng.between([13.8, 15])), grade, bags, at: at(year, 9, 15, rng.int([0, 40]), 10) });
        (byGrower.get(f.growerId) ?? byGrower.set(f.growerId, []).get(f.growerId)!).push(code);
        (byVariety.get(f.variety) ?? byVariety.set(f.variety, []).get(f.variety)!).push({ code, left: bags * 30, cls: -1, season: year });
      }
    }
    let slip = 0;
    // Each grower's delivery slip (recorded by the office for the grower), then the mill's receipt of each bag lot.
    for (const [growerId, codes] of byGrower) {
      const referenceDoc = `DS-${year}-${++slip}`;
      floor.record(c.office, { step: "shipping", partyId: growerId, counterpartyId: c.miller.partyId, at: at(year, 10, 24), inputs: codes.map(floor.all.bind(floor)), referenceDoc });
      for (const lot of codes) floor.record(c.miller, { step: "receiving", at: at(year, 10, 25), inputs: [floor.all(lot)], referenceDoc });
    }
  });
  const pools: Stock[][] = CLASSES.map(() => []);
  let corrections = c.shape.correctionsPerSeason;
  let runDay = 0;
  for (const lots of byVariety.values()) {
    while (lots.some((l) => l.left > 0)) {
      c.inTx(() => {
        const open = lots.filter((l) => l.left > 0);
        const picked = rng.sample(open, Math.min(open.length, rng.int(shape.polishInputs)));
        const inputs = picked.map((l) => ({ lot: l.code, quantity: l.left <= 900 ? l.left : r1(l.left * rng.between([0.4, 1])) }));
        const cls = pickClass(rng);
        const brown = inputs.reduce((a, i) => a + i.quantity, 0);
        const achieved = CLASSES[cls]!.target + rng.between([-0.9, 0.9]);
        const polishedKg = r1((brown * achieved) / 100);
        const run = (ratio = 1) => floor.record(c.miller, {
          step: "polishing", at: at(year, 10, 28, Math.floor(runDay / 3)),
          inputs, outputs: [{ kind: "polished", quantity: r1(polishedKg * ratio) }, { kind: "bran", quantity: r1((brown - polishedKg) * 0.97) }],
          measurements: [m("targetPolishingRatioPct", CLASSES[cls]!.target, "%")],
        });
        let result = run();
        if (corrections > 0 && runDay % 20 === 1) {
          // A run keyed from the wrong scale ticket, reversed and recorded again (common on the floor).
          corrections--;
          floor.record(c.office, { step: "correcting", corrects: result.id, reason: "Polished weight keyed from the wrong scale ticket" });
          for (const o of result.outputs) floor.onHand.set(o.code, 0);
          for (const i of inputs) floor.onHand.set(i.lot, floor.onHand.get(i.lot)! + i.quantity);
          result = run();
        }
        picked.forEach((l, n) => (l.left = r3(l.left - inputs[n]!.quantity)));
        const out = result.outputs.find((o) => o.kind === "polished")!;
        const shipped = { inputs: [{ lot: out.code, quantity: out.quantity }], referenceDoc: `SH-${out.code}` };
        floor.record(c.miller, { step: "shipping", counterpartyId: c.brewer.partyId, at: at(year, 11, 1, Math.floor(runDay / 3)), ...shipped });
        floor.record(c.brewer, { step: "receiving", at: at(year, 11, 2, Math.floor(runDay / 3)), ...shipped });
        pools[cls]!.push({ code: out.code, left: out.quantity, cls, season: year });
        runDay++;
      });
    }
  }
  return pools;
}

function pickClass(rng: Rng): number {
  let x = rng.next();
  for (let n = 0; n < CLASSES.length; n++) if ((x -= CLASSES[n]!.weight) < 0) return n;
  return CLASSES.length - 1;
}

/** Takes `kg` of polished rice from a pool, lot after lot: one soak batch per piece. */
function takeRice(pool: Stock[], kg: number): [string, number][] {
  const pieces: [string, number][] = [];
  while (kg > 0.05 && pool.length) {
    const lot = pool[0]!;
    const take = r1(Math.min(kg, lot.left));
    if (take > 0) pieces.push([lot.code, take]);
    lot.left = r3(lot.left - take);
    kg = r1(kg - take);
    if (lot.left <= 0.05) pool.shift();
  }
  return pieces;
}

/** Every tank of the season, start to pressing; returns the sake fractions. */
function brew(c: Ctx, year: number, season: number, pools: Stock[][]): Stock[] {
  const plan: { cls: number; rice: number }[] = [];
  const left = pools.map((p) => p.reduce((a, l) => a + l.left, 0));
  CLASSES.forEach((k, cls) => {
    while (left[cls]! >= k.tankRice[0] * c.shape.tankRiceScale) {
      const rice = r1(Math.min(left[cls]!, c.rng.between(k.tankRice) * c.shape.tankRiceScale));
      plan.push({ cls, rice });
      left[cls]! -= rice;
    }
  });
  const order = c.rng.sample(plan, plan.length);
  const fractions: Stock[] = [];
  order.forEach((tank, n) => {
    const start = Math.floor((n * 120) / order.length);
    c.inTx(() => fractions.push(...brewTank(c, year, season, tank.cls, tank.rice, pools[tank.cls]!, start, n + 1)));
  });
  return fractions;
}

function soakAndSteam(c: Ctx, pieces: [string, number][], batches: number, use: string, year: number, day: number) {
  const { floor, rng, brewer } = c;
  const soaked: string[] = [];
  for (const [lot, kg] of pieces) {
    const per = Math.ceil(batches * (kg / pieces.reduce((a, p) => a + p[1], 0)));
    for (let b = 0; b < per; b++) {
      const dry = b === per - 1 ? r1(kg - (per - 1) * r1(kg / per)) : r1(kg / per);
      if (dry <= 0) continue;
      const absorption = use === "koji" ? rng.between([1.3, 1.35]) : rng.between([1.25, 1.3]);
      soaked.push(floor.record(brewer, { step: "soaking", at: at(year, 11, 1, day), inputs: [{ lot, quantity: dry }], outputs: [{ kind: "soaked", quantity: r1(dry * absorption), use }], measurements: [m("soakMinutes", use === "koji" ? 12 : 40, "min"), m("waterTempC", 9, "°C")] }).outputs[0]!.code);
    }
  }
  const dryKg = pieces.reduce((a, p) => a + p[1], 0);
  return { soaked, dryKg };
}

function steam(c: Ctx, soaked: string[], dryKg: number, year: number, day: number) {
  return c.floor.record(c.brewer, { step: "steaming", at: at(year, 11, 1, day + 1), inputs: soaked.map((s) => c.floor.all(s)), outputs: [{ kind: "steamed", quantity: r1(dryKg * c.rng.between([1.36, 1.4])) }], measurements: [m("steamMinutes", 50, "min")] }).outputs[0]!;
}

/** Splits a steamed lot into portions by share; the last takes what the rounding left. */
function split(c: Ctx, lot: { code: string }, portions: { share: number; use: string; addition?: string }[], year: number, day: number) {
  const total = c.floor.onHand.get(lot.code)!;
  let given = 0;
  const outputs = portions.map((p, n) => {
    const quantity = n === portions.length - 1 ? r3(total - given) : r1(total * p.share);
    given += quantity;
    return { kind: "steamed" as const, quantity, use: p.use, ...(p.addition ? { addition: p.addition } : {}) };
  });
  return c.floor.record(c.brewer, { step: "splitting", at: at(year, 11, 1, day + 1), inputs: [{ lot: lot.code, quantity: total }], outputs }).outputs.map((o) => o.code);
}

function brewTank(c: Ctx, year: number, season: number, cls: number, rice: number, pool: Stock[], start: number, no: number): Stock[] {
  const { floor, rng, brewer, shape } = c;
  const kojiRice = takeRice(pool, r1(rice * 0.2));
  const mashRice = takeRice(pool, r1(rice * 0.8));
  const koji = soakAndSteam(c, kojiRice, rng.int(shape.soaksKoji), "koji", year, start);
  const kojiSteamed = steam(c, koji.soaked, koji.dryKg, year, start);
  const kojiPortions = split(c, kojiSteamed, [0.1, 0.2, 0.3, 0.4].map((share) => ({ share, use: "koji" })), year, start);
  const kojiLots = kojiPortions.map((p) =>
    floor.record(brewer, { step: "koji-making", at: at(year, 11, 3, start), inputs: [floor.all(p)], outputs: [{ kind: "koji", quantity: r1(floor.onHand.get(p)! * 0.86) }], measurements: [m("sporeG", rice / 10, "g")] }).outputs[0]!.code,
  );
  const batches = rng.int(shape.soaksMash);
  const firstHalf = takeShare(mashRice, 0.35);
  const mashA = soakAndSteam(c, firstHalf, Math.max(1, Math.round(batches * 0.35)), "mash", year, start + 2);
  const mashB = soakAndSteam(c, mashRice, Math.max(1, batches - Math.round(batches * 0.35)), "mash", year, start + 4);
  const [forStarter, first] = split(c, steam(c, mashA.soaked, mashA.dryKg, year, start + 2), [{ share: 0.3, use: "starter" }, { share: 0.7, use: "mash", addition: "first" }], year, start + 2);
  const [middle, last] = split(c, steam(c, mashB.soaked, mashB.dryKg, year, start + 4), [{ share: 0.4, use: "mash", addition: "middle" }, { share: 0.6, use: "mash", addition: "final" }], year, start + 4);
  const water = (kg: number) => m("waterL", kg, "L");
  const sum = (...codes: string[]) => codes.reduce((a, x) => a + floor.onHand.get(x)!, 0);
  const starter = floor.record(brewer, { step: "starter", at: at(year, 11, 5, start), inputs: [floor.all(kojiLots[0]!), floor.all(forStarter!)], outputs: [{ kind: "starter", quantity: r1(sum(kojiLots[0]!, forStarter!) + rice * 0.08) }], measurements: [water(rice * 0.08)] }).outputs[0]!.code;
  const tank = floor.record(brewer, { step: "mash-addition", at: at(year, 11, 20, start), attributes: { addition: "first" }, inputs: [floor.all(starter), floor.all(kojiLots[1]!), floor.all(first!)], outputs: [{ kind: "tank", quantity: r1(sum(starter, kojiLots[1]!, first!) + rice * 0.17), tankName: `Tank ${season + 1}-${no}` }], measurements: [water(rice * 0.17)] }).outputs[0]!.code;
  for (const [addition, kojiLot, portion, plus, w] of [["middle", kojiLots[2]!, middle!, 2, 0.35], ["final", kojiLots[3]!, last!, 3, 0.7]] as const) {
    floor.record(brewer, { step: "mash-addition", at: at(year, 11, 20, start + plus), attributes: { addition }, inputs: [floor.all(kojiLot), floor.all(portion)], outputs: [{ lot: tank, quantity: r1(sum(kojiLot, portion) + rice * w) }], measurements: [water(rice * w)] });
  }
  const sake = rice * rng.between([1.6, 1.8]);
  const shares = [rng.between([0.12, 0.18]), 0, rng.between([0.2, 0.3])];
  shares[1] = 1 - shares[0]! - shares[2]!;
  const pressed = floor.record(brewer, {
    step: "pressing", at: at(year, 12, 20, start), inputs: [floor.all(tank)],
    outputs: [...["arabashiri", "nakadori", "seme"].map((fraction, n) => ({ kind: "sake" as const, quantity: r1(sake * shares[n]!), fraction })), { kind: "lees", quantity: r1(rice * 0.35) }],
  });
  return pressed.outputs.filter((o) => o.kind === "sake").map((o) => ({ code: o.code, left: o.quantity, cls, season }));
}

/** Splits a list of rice pieces: the first `share` of the kilos leave the list. */
function takeShare(pieces: [string, number][], share: number): [string, number][] {
  const want = r1(pieces.reduce((a, p) => a + p[1], 0) * share);
  const taken: [string, number][] = [];
  let need = want;
  while (need > 0.05 && pieces.length) {
    const [lot, kg] = pieces[0]!;
    const take = r1(Math.min(kg, need));
    taken.push([lot, take]);
    need = r1(need - take);
    if (kg - take <= 0.05) pieces.shift();
    else pieces[0] = [lot, r1(kg - take)];
  }
  return taken;
}

/** One blending run: draws a share of each input, fills `outputs` storage tanks. */
function blend(c: Ctx, inputs: Stock[], share: Range, outputs: number, date: string, cls: number, season: number): Stock[] {
  const draws = inputs.map((s) => ({ lot: s.code, quantity: r1(s.left * c.rng.between(share)) })).filter((d) => d.quantity > 0);
  if (draws.length < 2) return [];
  const litres = draws.reduce((a, d) => a + d.quantity, 0);
  const k = c.capOutputs(draws.map((d) => d.lot), outputs);
  const each = Math.floor((litres * 10) / k) / 10;
  const made = c.floor.record(c.brewer, { step: "blending", at: date, inputs: draws, outputs: Array.from({ length: k }, () => ({ kind: "blend" as const, quantity: each })) });
  inputs.forEach((s) => (s.left = c.floor.onHand.get(s.code)!));
  return made.outputs.map((o) => ({ code: o.code, left: o.quantity, cls, season }));
}

/** Assembly blends: fractions of one class, several tanks each, into storage tanks. */
function assemble(c: Ctx, year: number, season: number, fractions: Stock[]): Stock[] {
  const storage: Stock[] = [];
  CLASSES.forEach((_, cls) => {
    const pool = fractions.filter((f) => f.cls === cls);
    const avg = (c.shape.blendInputs[0] + c.shape.blendInputs[1]) / 2;
    const runs = Math.ceil((pool.length * c.shape.drawsPerFraction) / Math.min(avg, pool.length || 1));
    for (let r = 0; r < runs && pool.length >= 2; r++) {
      const inputs = c.rng.sample(pool.filter((f) => f.left > 20), Math.min(pool.length, c.rng.int(c.shape.blendInputs)));
      c.inTx(() => storage.push(...blend(c, inputs, [0.15, 0.3], c.rng.int(c.shape.blendOutputs), at(year + 1, 4, 1, r * 2 + cls * 40), cls, season)));
    }
  });
  return storage;
}

/** House blends: blends of this season's assembly blends across classes, some with aged stock. */
function houseBlends(c: Ctx, year: number, season: number, storage: Stock[]): Stock[] {
  const house: Stock[] = [];
  for (let r = 0; r < c.shape.houseBlends; r++) {
    const inputs = c.rng.sample(storage.filter((s) => s.left > 20), c.rng.int(c.shape.houseInputs));
    const aged = c.aged.filter((a) => a.left > 20);
    if (aged.length && c.rng.next() < c.shape.agedStockChance) inputs.push(c.rng.pick(aged));
    const cls = inputs[0]?.cls ?? 0;
    c.inTx(() => house.push(...blend(c, inputs, [0.2, 0.45], c.rng.int(c.shape.houseOutputs), at(year + 1, 8, 1, r * 3), cls, season)));
  }
  return house;
}

/** Bottlings in 1.8 L, 720 mL and 300 mL; GTINs from GS1's example 950 prefix, never a real product's. */
function bottle(c: Ctx, year: number, blends: Stock[], fractions: Stock[]) {
  const { rng, floor } = c;
  const targets = [...blends.map((b) => ({ s: b, runs: rng.int([1, 3]) })), ...fractions.filter((f) => f.left > 50 && rng.next() < 0.2).map((s) => ({ s, runs: 1 }))];
  let day = 0;
  c.inTx(() => {
    for (const { s, runs } of targets) {
      for (let n = 0; n < runs; n++) {
        const ml = rng.pick([1800, 720, 720, 300] as const);
        // Keep a third back: aged stock for later house blends.
        const count = Math.floor((s.left * rng.between([0.2, 0.35]) * 1000) / ml);
        if (count < 1) continue;
        const body = `${CLASSES[s.cls]!.gtin}00${[1800, 720, 300].indexOf(ml)}`;
        const code = `${body}${gtinCheckDigit(body)}`;
        floor.record(c.brewer, { step: "bottling", at: at(year + 1, 9, 1, day++ % 200), inputs: [{ lot: s.code, quantity: (count * ml) / 1000 }], outputs: [{ kind: "bottled", quantity: count, bottleMl: ml, gtin: code }] });
        s.left = floor.onHand.get(s.code)!;
      }
    }
  });
}

export function countLedger(sqlite: { prepare(sql: string): { get(): unknown; all(): unknown[] } }) {
  const n = (sql: string) => (sqlite.prepare(sql).get() as { n: number }).n;
  const lotsByKind = Object.fromEntries((sqlite.prepare("select kind, count(*) as n from lots group by kind").all() as { kind: string; n: number }[]).map((r) => [r.kind, r.n]));
  return {
    lots: n("select count(*) as n from lots"),
    edges: n("select count(*) as n from lineage_edges"),
    compositionRows: n("select count(*) as n from lot_source_deltas"),
    events: n("select count(*) as n from events"),
    lotsByKind,
    blendsOfBlends: n("select count(distinct e.child_lot_id) as n from lineage_edges e join lots c on c.id = e.child_lot_id join lots p on p.id = e.parent_lot_id where c.kind = 'blend' and p.kind = 'blend'"),
  };
}

/** The cached ledger of `seasons` seasons, generated once (the .json beside it marks it complete). */
export async function ensureLedger(seasons: number, log: (line: string) => void = console.log): Promise<{ file: string; counts: LedgerCounts; generated: boolean }> {
  const file = ledgerFile(seasons);
  const done = `${file}.json`;
  if (existsSync(file) && existsSync(done)) {
    process.env.GRAINLINE_DB = file;
    return { file, counts: JSON.parse(readFileSync(done, "utf8")) as LedgerCounts, generated: false };
  }
  mkdirSync(path.dirname(file), { recursive: true });
  rmSync(done, { force: true });
  log(`Generating ${seasons} season(s) into ${path.relative(process.cwd(), file)} …`);
  const counts = await generateLedger(file, { seasons, log });
  writeFileSync(done, JSON.stringify(counts, null, 2));
  return { file, counts, generated: true };
}

export function printCounts(counts: LedgerCounts, log: (line: string) => void = console.log) {
  log(`seasons ${counts.seasons}: ${counts.lots} lots, ${counts.edges} lineage edges, ${counts.compositionRows} composition rows, ${counts.events} events, ${counts.blendsOfBlends} blends of blends; generated in ${counts.seconds.toFixed(1)} s`);
  log(`lots by kind: ${Object.entries(counts.lotsByKind).map(([k, v]) => `${k} ${v}`).join(", ")}`);
}

export function argValue(name: string, fallback: number): number {
  const at = process.argv.indexOf(`--${name}`);
  const value = at >= 0 ? Number(process.argv[at + 1]) : fallback;
  if (!Number.isInteger(value) || value < 1) throw new Error(`--${name} takes a whole number ≥ 1`);
  return value;
}

if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  const { counts } = await ensureLedger(argValue("seasons", 10));
  printCounts(counts);
}
