/**
 * Trace latency on a generated ledger (`npm run bench -- --seasons 10 --runs 200 [--path-runs 50]`).
 * Ways to answer the same question, on the same randomly drawn lots:
 *   (a) the API's functions, traceBackward / traceForward (src/server/trace/trace.ts);
 *   (b) a loop of one query per hop in JavaScript, each lot's parents (or children) read once;
 *   (b′) the same loop walking path by path, one query per step of every path;
 *   (c) one bare WITH RECURSIVE over lineage_edges, path by path, as in tests/integration/trace.test.ts;
 *   (d) forward only: a proposal for descendantsOf (distinct walk in SQL, fractions in JS).
 * Times are wall-clock (performance.now) around the call, in one process, on a warm page cache.
 */
import os from "node:os";
import type { SessionUser } from "@/server/accounts/session";
import { argValue, ensureLedger, printCounts, seededRandom } from "./generate-ledger";

type Shares = Map<number, number>;
type Sqlite = import("better-sqlite3").Database;
type Case = "bottled" | "harvest" | "polished";
const CASES: { key: Case; label: string; direction: "backward" | "forward" }[] = [
  { key: "bottled", label: "bottled ← backward", direction: "backward" },
  { key: "harvest", label: "harvest → forward", direction: "forward" },
  { key: "polished", label: "polished → forward", direction: "forward" },
];
const TOLERANCE = 1e-9;

type Hop = { next: number; share: number; leaf: number };

/** The one-hop queries both loops use: a lot's parents (with whether they are harvest lots) or its children. */
function hopStatements(sqlite: Sqlite) {
  return {
    head: sqlite.prepare("select id, kind from lots where code = ?"),
    up: sqlite.prepare(`select e.parent_lot_id as next, sum(e.weight) / c.content_in as share, p.kind = 'harvest' as leaf
    from lineage_edges e join lots c on c.id = e.child_lot_id join lots p on p.id = e.parent_lot_id
    where e.child_lot_id = ? and c.content_in > 0 group by e.parent_lot_id`),
    down: sqlite.prepare(`select e.child_lot_id as next, sum(e.weight) / c.content_in as share, 0 as leaf
    from lineage_edges e join lots c on c.id = e.child_lot_id
    where e.parent_lot_id = ? and c.content_in > 0 group by e.child_lot_id`),
  };
}

/** (b) Each lot's parents (backward) or children (forward) by one query, then fractions multiplied down in topological order. */
function perHopWalker(sqlite: Sqlite) {
  const { head, up, down } = hopStatements(sqlite);
  return (code: string, direction: "backward" | "forward"): { shares: Shares; queries: number } => {
    const root = head.get(code) as { id: number; kind: string };
    const hops = new Map<number, Hop[]>();
    const order: number[] = [];
    const statement = direction === "backward" ? up : down;
    if (direction === "backward" && root.kind === "harvest") return { shares: new Map([[root.id, 1]]), queries: 1 };
    const visit = (id: number) => {
      if (hops.has(id)) return;
      const rows = statement.all(id) as Hop[];
      hops.set(id, rows);
      for (const r of rows) if (!r.leaf) visit(r.next);
      order.push(id);
    };
    visit(root.id);
    // Reverse post-order is a topological order: a lot's fraction is complete before it is passed on.
    const fraction = new Map<number, number>([[root.id, 1]]);
    const harvests: Shares = new Map();
    for (let n = order.length - 1; n >= 0; n--) {
      const id = order[n]!;
      const f = fraction.get(id)!;
      for (const r of hops.get(id)!) {
        const target = r.leaf ? harvests : fraction;
        target.set(r.next, (target.get(r.next) ?? 0) + f * r.share);
      }
    }
    const shares = direction === "backward" ? harvests : fraction;
    if (direction === "forward") shares.delete(root.id);
    for (const [k, v] of shares) if (Math.abs(v) <= TOLERANCE) shares.delete(k);
    return { shares, queries: hops.size + 1 };
  };
}

/**
 * (b′) The same hops walked path by path, as a first version would: one query per step of
 * every path, fractions multiplied along it. A lot reached by many paths is read many times.
 */
function pathWalker(sqlite: Sqlite) {
  const { head, up, down } = hopStatements(sqlite);
  return (code: string, direction: "backward" | "forward"): Shares => {
    const root = head.get(code) as { id: number; kind: string };
    if (direction === "backward" && root.kind === "harvest") return new Map([[root.id, 1]]);
    const statement = direction === "backward" ? up : down;
    const shares: Shares = new Map();
    const stack: [number, number][] = [[root.id, 1]];
    while (stack.length) {
      const [id, f] = stack.pop()!;
      for (const r of statement.all(id) as Hop[]) {
        const g = f * r.share;
        if (direction === "forward" || r.leaf) shares.set(r.next, (shares.get(r.next) ?? 0) + g);
        if (!r.leaf) stack.push([r.next, g]);
      }
    }
    for (const [k, v] of shares) if (Math.abs(v) <= TOLERANCE) shares.delete(k);
    return shares;
  };
}

/** (c) The bare recursive SQL: every path multiplied out, summed per lot at the end. */
function recursiveSql(sqlite: Sqlite) {
  const head = sqlite.prepare("select id from lots where code = ?");
  const up = sqlite.prepare(`with recursive up(lot_id, frac) as (
      select ?, 1.0
      union all
      select e.parent_lot_id, up.frac * e.weight / c.content_in
      from up join lots c on c.id = up.lot_id join lineage_edges e on e.child_lot_id = up.lot_id
      where c.content_in > 0)
    select up.lot_id as id, sum(frac) as share from up join lots l on l.id = up.lot_id
    where l.kind = 'harvest' group by up.lot_id having abs(sum(frac)) > 1e-9`);
  const down = sqlite.prepare(`with recursive down(lot_id, frac) as (
      select @id, 1.0
      union all
      select e.child_lot_id, down.frac * e.weight / c.content_in
      from down join lineage_edges e on e.parent_lot_id = down.lot_id join lots c on c.id = e.child_lot_id
      where c.content_in > 0)
    select lot_id as id, sum(frac) as share from down where lot_id <> @id
    group by lot_id having abs(sum(frac)) > 1e-9`);
  return (code: string, direction: "backward" | "forward"): Shares => {
    const { id } = head.get(code) as { id: number };
    const rows = (direction === "backward" ? up.all(id) : down.all({ id })) as { id: number; share: number }[];
    return new Map(rows.map((r) => [r.id, r.share]));
  };
}

/**
 * (d) A proposal for forward trace from a lot that is not a harvest lot: SQLite finds the set of
 * descendants (UNION, so each lot once) and their edges in one statement; JavaScript multiplies
 * the fractions down in topological order (Kahn). Same answer as the path-by-path CTE.
 */
function distinctWalk(sqlite: Sqlite) {
  const head = sqlite.prepare("select id from lots where code = ?");
  const edges = sqlite.prepare(`with recursive reach(id) as (
      select @id
      union
      select e.child_lot_id from lineage_edges e join reach on e.parent_lot_id = reach.id join lots c on c.id = e.child_lot_id
      where c.content_in > 0)
    select e.parent_lot_id as parent, e.child_lot_id as child, sum(e.weight) / c.content_in as share
    from reach join lineage_edges e on e.parent_lot_id = reach.id join lots c on c.id = e.child_lot_id
    where c.content_in > 0 group by e.parent_lot_id, e.child_lot_id`);
  return (code: string): Shares => {
    const { id } = head.get(code) as { id: number };
    const rows = edges.all({ id }) as { parent: number; child: number; share: number }[];
    const out = new Map<number, { child: number; share: number }[]>();
    const waiting = new Map<number, number>();
    for (const r of rows) {
      (out.get(r.parent) ?? out.set(r.parent, []).get(r.parent)!).push(r);
      waiting.set(r.child, (waiting.get(r.child) ?? 0) + 1);
    }
    const fraction: Shares = new Map([[id, 1]]);
    const ready = [id];
    while (ready.length) {
      const lot = ready.pop()!;
      const f = fraction.get(lot)!;
      for (const r of out.get(lot) ?? []) {
        fraction.set(r.child, (fraction.get(r.child) ?? 0) + f * r.share);
        const left = waiting.get(r.child)! - 1;
        waiting.set(r.child, left);
        if (left === 0) ready.push(r.child);
      }
    }
    fraction.delete(id);
    for (const [k, v] of fraction) if (Math.abs(v) <= TOLERANCE) fraction.delete(k);
    return fraction;
  };
}

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

function time(fn: () => unknown): number {
  const t0 = performance.now();
  fn();
  return performance.now() - t0;
}

/** Largest difference between two share maps, by lot id (a lot missing on one side counts whole). */
function maxDifference(a: Shares, b: Shares): number {
  let worst = 0;
  for (const k of new Set([...a.keys(), ...b.keys()])) worst = Math.max(worst, Math.abs((a.get(k) ?? 0) - (b.get(k) ?? 0)));
  return worst;
}

type Direction = "backward" | "forward";
/** `runs` caps how many of the lots a slow method is timed on (the first ones, still a random draw). */
type Method = { key: string; label: string; run: (code: string, d: Direction) => Shares | number; only?: Direction; runs?: number };
type Cell = { p50: number; p95: number; max: number };

/** Times every method on every lot, rotating the order so that no method always runs on a cache its predecessor warmed. */
function measure(all: Method[], lots: string[], direction: Direction): Record<string, Cell> {
  const methods = all.filter((m) => !m.only || m.only === direction);
  const samples: Record<string, number[]> = Object.fromEntries(methods.map((m) => [m.key, []]));
  for (const code of lots.slice(0, 5)) for (const m of methods) m.run(code, direction);
  lots.forEach((code, n) => {
    for (let k = 0; k < methods.length; k++) {
      const m = methods[(n + k) % methods.length]!;
      if (n < (m.runs ?? Infinity)) samples[m.key]!.push(time(() => m.run(code, direction)));
    }
  });
  return Object.fromEntries(methods.map((m) => {
    const sorted = samples[m.key]!.sort((x, y) => x - y);
    return [m.key, { p50: percentile(sorted, 50), p95: percentile(sorted, 95), max: sorted.at(-1)! }];
  }));
}

const ms = (x: number) => (x < 10 ? x.toFixed(2) : x.toFixed(1)).padStart(9);
const times = (x: number) => `${x < 10 ? x.toFixed(2) : x.toFixed(0)}×`.padStart(9);

async function main() {
  const seasons = argValue("seasons", 10);
  const runs = argValue("runs", 200);
  const pathRuns = Math.min(runs, argValue("path-runs", runs));
  const { counts } = await ensureLedger(seasons);
  printCounts(counts);
  const { getSqlite } = await import("@/server/platform/db");
  const { traceBackward, traceForward } = await import("@/server/trace/trace");
  const sqlite = getSqlite();
  const actor: SessionUser = { id: "bench-office", role: "admin", partyId: "bench-brewery", email: "office@bench.example", name: "Bench Office" };
  const idOf = (code: string) => (sqlite.prepare("select id from lots where code = ?").get(code) as { id: number }).id;
  const apiShares = (code: string, d: Direction): Shares =>
    d === "backward"
      ? new Map(traceBackward(actor, code).sources.map((s) => [idOf(s.code), s.share]))
      : new Map(traceForward(actor, code).reached.map((r) => [idOf(r.code), r.fraction]));
  const perHop = perHopWalker(sqlite);
  const methods: Method[] = [
    { key: "a", label: "(a) API trace.ts", run: (code, d) => (d === "backward" ? traceBackward(actor, code).sources.length : traceForward(actor, code).reached.length) },
    { key: "b", label: "(b) per-hop, per lot", run: (code, d) => perHop(code, d).shares },
    { key: "b2", label: "(b′) per-hop, per path", run: pathWalker(sqlite), runs: pathRuns },
    { key: "c", label: "(c) recursive SQL", run: recursiveSql(sqlite) },
    { key: "d", label: "(d) proposal, forward", run: distinctWalk(sqlite), only: "forward" },
  ];

  const rng = seededRandom(7);
  const codesOf = (kind: string) => (sqlite.prepare("select code from lots where kind = ? and content_in > 0 order by id").all(kind) as { code: string }[]).map((r) => r.code);
  const picks = Object.fromEntries(CASES.map((c) => {
    const pool = codesOf(c.key);
    return [c.key, Array.from({ length: runs }, () => rng.pick(pool))];
  })) as Record<Case, string[]>;
  // The bottled lots with the largest compositions: blends of blends that carry aged stock.
  const worst = (sqlite.prepare(`select l.code from lots l join lot_source_deltas d on d.lot_id = l.id where l.kind = 'bottled'
    group by l.id order by count(*) desc, l.id limit 10`).all() as { code: string }[]).map((r) => r.code);

  const sampleSize = Math.min(25, runs);
  console.log(`\nAgreement with (a) on the first ${sampleSize} lots of each case (tolerance ${TOLERANCE}):`);
  const countPaths = {
    backward: sqlite.prepare("with recursive up(lot_id) as (select ? union all select e.parent_lot_id from up join lineage_edges e on e.child_lot_id = up.lot_id) select count(*) as n from up"),
    forward: sqlite.prepare("with recursive down(lot_id) as (select ? union all select e.child_lot_id from down join lineage_edges e on e.parent_lot_id = down.lot_id) select count(*) as n from down"),
  };
  let disagreements = 0;
  const sizes: Record<string, number> = {};
  for (const c of [...CASES, { key: "worst" as const, label: "largest bottled ←", direction: "backward" as const }]) {
    const sample = c.key === "worst" ? worst : picks[c.key].slice(0, sampleSize);
    let worstDiff = 0, size = 0, queries = 0, paths = 0, bytes = 0, stringify = 0;
    for (const code of sample) {
      const answer = c.direction === "backward" ? traceBackward(actor, code) : traceForward(actor, code);
      stringify += time(() => (bytes += JSON.stringify(answer).length));
      const a = apiShares(code, c.direction);
      const b = perHop(code, c.direction);
      for (const m of methods.slice(2)) if (!m.only || m.only === c.direction) worstDiff = Math.max(worstDiff, maxDifference(a, m.run(code, c.direction) as Shares));
      worstDiff = Math.max(worstDiff, maxDifference(a, b.shares));
      size += a.size;
      queries += b.queries;
      paths += (countPaths[c.direction].get(idOf(code)) as { n: number }).n;
    }
    if (worstDiff > TOLERANCE) disagreements++;
    sizes[c.key] = size / sample.length;
    const avg = (x: number) => Math.round(x / sample.length);
    console.log(`  ${c.label.padEnd(20)} (b) (b′) (c) (d): max |difference| ${worstDiff.toExponential(2)} ${worstDiff <= TOLERANCE ? "ok" : "MISMATCH"}; on average ${avg(size)} lots in the answer, ${avg(queries)} lots read by (b), ${avg(paths)} paths walked by (b′) and (c); (a)'s answer as JSON ${(bytes / sample.length / 1024).toFixed(1)} KB, JSON.stringify ${(stringify / sample.length).toFixed(2)} ms (not in the timings)`);
  }

  const results = {} as Record<Case | "worst", Record<string, Cell>>;
  for (const c of CASES) {
    const started = performance.now();
    results[c.key] = measure(methods, picks[c.key], c.direction);
    console.log(`  timed ${c.label}: ${runs} lots × ${Object.keys(results[c.key]).length} methods in ${((performance.now() - started) / 1000).toFixed(1)} s`);
  }
  results.worst = measure(methods, worst, "backward");

  console.log(`\n${os.cpus()[0]?.model ?? "cpu"} (${os.availableParallelism()} cores, load average ${os.loadavg()[0]!.toFixed(1)}), Node ${process.version}, SQLite ${(sqlite.prepare("select sqlite_version() as v").get() as { v: string }).v}; ${runs} random lots per case (${pathRuns} for (b′)); ms`);
  console.log(`${"".padEnd(24)}${CASES.map((c) => c.label.padStart(20)).join("")}`);
  console.log(`${"".padEnd(24)}${CASES.map(() => `${"p50".padStart(9)}  ${"p95".padStart(9)}`).join("")}`);
  const cell = (x: Cell | undefined, f: (c: Cell) => string) => (x ? f(x) : `${"—".padStart(9)}  ${"—".padStart(9)}`);
  for (const m of methods) console.log(`${m.label.padEnd(24)}${CASES.map((c) => cell(results[c.key][m.key], (x) => `${ms(x.p50)}  ${ms(x.p95)}`)).join("")}`);
  const ratio = (over: string, under: string) =>
    CASES.map((c) => {
      const [x, y] = [results[c.key][over], results[c.key][under]];
      return x && y ? `${times(x.p50 / y.p50)}  ${times(x.p95 / y.p95)}` : cell(undefined, String);
    }).join("");
  console.log(`${"speed-up (b) / (a)".padEnd(24)}${ratio("b", "a")}`);
  console.log(`${"speed-up (b′) / (a)".padEnd(24)}${ratio("b2", "a")}`);
  console.log(`${"(a) / (c)".padEnd(24)}${ratio("a", "c")}`);
  console.log(`${"(a) / (d)".padEnd(24)}${ratio("a", "d")}`);
  console.log(`${"answer size (lots)".padEnd(24)}${CASES.map((c) => `${String(Math.round(sizes[c.key]!)).padStart(20)}`).join("")}`);
  console.log(`\nThe ${worst.length} bottled lots with the largest compositions (${Math.round(sizes.worst!)} harvest lots on average), backward, ms:`);
  console.log(`${"".padEnd(24)}${"p50".padStart(9)}  ${"max".padStart(9)}`);
  for (const m of methods.filter((x) => !x.only)) console.log(`${m.label.padEnd(24)}${ms(results.worst[m.key]!.p50)}  ${ms(results.worst[m.key]!.max)}`);

  const bt = results.bottled;
  const [a, b, b2, c] = [bt.a!, bt.b!, bt.b2!, bt.c!];
  const goals = [
    [`backward trace of a bottled lot ≤ 10 ms p95 in the API function (${a.p95.toFixed(2)} ms)`, a.p95 <= 10],
    [`≥ 50× faster than the per-hop loop, per path (${(b2.p50 / a.p50).toFixed(0)}× at p50, ${(b2.p95 / a.p95).toFixed(0)}× at p95)`, b2.p50 / a.p50 >= 50 && b2.p95 / a.p95 >= 50],
    [`≥ 50× faster than the per-hop loop, per lot (${(b.p50 / a.p50).toFixed(0)}× at p50, ${(b.p95 / a.p95).toFixed(0)}× at p95)`, b.p50 / a.p50 >= 50 && b.p95 / a.p95 >= 50],
    [`within 2× of the bare recursive SQL (${(a.p50 / c.p50).toFixed(3)}× at p50, ${(a.p95 / c.p95).toFixed(3)}× at p95)`, a.p50 <= 2 * c.p50 && a.p95 <= 2 * c.p95],
  ] as const;
  console.log("\nGoals (bottled lots, backward):");
  for (const [text, met] of goals) console.log(`  ${met ? "met    " : "NOT met"}  ${text}`);
  if (disagreements) {
    console.error(`\n${disagreements} case(s) where the methods disagree beyond ${TOLERANCE}.`);
    process.exitCode = 1;
  }
}

await main();
