import "server-only";
import { sql } from "drizzle-orm";
import { getDb, getSqlite } from "../platform/db";
import { CHECK_AT_MOST, touchedSince, type LedgerMark } from "./edge-index";

/**
 * Figures worked out from the ledger for one lot at a time, kept across requests and lineages:
 * every bottling of a house blend has the same 400–530 tanks behind it, and working out their
 * facts and dates anew was most of the time of a bottling's first view.
 *
 * Each figure is kept with the lots it rests on, and dropped when a row recorded since names one
 * of them. That holds because a lot's code, kind, grade, ratio and attributes are fixed when it
 * is made (the database refuses to change them), and everything else is only ever added, by rows
 * that name the lots they change: an event's outputs, inputs and readings, a correction's
 * readings (correcting a reading writes no input or output), a new edge's child, an attachment.
 */
export type Worked<T> = { value: T; on: ArrayLike<number> };

const stores: KeptByLot<unknown>[] = [];
let swept: { sqlite: ReturnType<typeof getSqlite>; mark: LedgerMark } | undefined;

/** The lots named by a row recorded since `seen`, or null when there are more than are worth checking. */
function namedSince(seen: LedgerMark): number[] | null {
  const row = getDb().get<{ lots: string; n: number }>(
    touchedSince(
      seen,
      sql`
    union all select lot_id from measurements where event_id > ${seen.event} and lot_id is not null
    union all select m.lot_id from events c join measurements m on m.event_id = c.corrects where c.id > ${seen.event} and m.lot_id is not null
    union all select lot_id from attachments where id > ${seen.attachment}`,
    ),
  )!;
  return row.n > CHECK_AT_MOST ? null : [...new Set(JSON.parse(row.lots) as number[])];
}

/**
 * Brings every store to the ledger at `mark` (one read for all of them), or answers false when
 * `mark` is older than what they may already hold (a lineage read before another request's).
 */
function sweepTo(mark: LedgerMark): boolean {
  const sqlite = getSqlite();
  // Another database (a test's own file): nothing kept from the one before holds there.
  if (swept?.sqlite !== sqlite) {
    for (const store of stores) store.clear();
    swept = { sqlite, mark };
    return true;
  }
  const seen = swept.mark;
  if (mark.event < seen.event || mark.edge < seen.edge || mark.attachment < seen.attachment) return false;
  if (mark.event === seen.event && mark.edge === seen.edge && mark.attachment === seen.attachment) return true;
  const named = namedSince(seen);
  const marked = new Uint8Array((named ?? []).reduce((a, lot) => Math.max(a, lot + 1), 0));
  for (const lot of named ?? []) marked[lot] = 1;
  for (const store of stores) {
    if (named) store.dropOn(marked);
    else store.clear();
  }
  swept.mark = mark;
  return true;
}

/** How many figures each store keeps, by name: what the warm-up's test counts. */
export function keptCounts(): Record<string, number> {
  return Object.fromEntries(stores.map((store) => [store.name, store.size]));
}

/** Drops every figure kept, as a restart would: the provenance bench times a first view with nothing kept. */
export function forgetKept() {
  swept = undefined;
  for (const store of stores) store.clear();
}

export class KeptByLot<T> {
  private byId = new Map<number, Worked<T>>();
  /** The database the figures come from: another (a test's own file) and none of them holds. */
  private sqlite: ReturnType<typeof getSqlite> | undefined;

  /** `most`: past this many figures, all are dropped and kept afresh. */
  constructor(
    readonly name: string,
    private readonly most: number,
  ) {
    stores.push(this as KeptByLot<unknown>);
  }

  get size() {
    return this.byId.size;
  }

  clear() {
    this.byId = new Map();
  }

  /**
   * Drops the figures that rest on a lot named: each figure's lots are read through, with no index
   * from lot to figure. Such an index cost a blend's first view 6 ms to build (20,000 lots behind
   * 530 tanks); reading 60,000 lots through after a change costs a fraction of a millisecond.
   */
  dropOn(named: Uint8Array) {
    for (const [id, worked] of this.byId) {
      const on = worked.on;
      for (let i = 0; i < on.length; i++) {
        const lot = on[i]!;
        if (lot < named.length && named[lot] === 1) {
          this.byId.delete(id);
          break;
        }
      }
    }
  }

  /** Whether figures may be kept now: not inside a caller's transaction (it may yet be rolled back). */
  private keeping(): boolean {
    const sqlite = getSqlite();
    if (sqlite.inTransaction) return false;
    if (this.sqlite !== sqlite) this.clear(), (this.sqlite = sqlite);
    if (this.byId.size > this.most) this.clear();
    return true;
  }

  /** The figures of `ids`: those kept, and the others from `work`, kept in turn. */
  private keptOrWorked(ids: number[], work: (missing: number[]) => Map<number, Worked<T>>): Map<number, T> {
    const missing = ids.filter((id) => !this.byId.has(id));
    if (missing.length) for (const [id, worked] of work(missing)) this.byId.set(id, worked);
    return new Map(ids.map((id) => [id, this.byId.get(id)!.value]));
  }

  /**
   * Figures that rest on no lot but the one they are of, and on nothing of it that ever changes
   * (what a lot is, fixed when it is made): kept once read, with no mark to check.
   */
  fixedOf(ids: number[], work: (missing: number[]) => Map<number, T>): Map<number, T> {
    const asWorked = (missing: number[]) => new Map([...work(missing)].map(([id, value]) => [id, { value, on: [] }]));
    if (!this.keeping()) return work(ids);
    return this.keptOrWorked(ids, asWorked);
  }

  /**
   * The figures of `ids` as the ledger stands at `mark`: those kept, and the others from `work`
   * (given the ids missing), kept in turn. With no mark (read inside a caller's transaction, which
   * may yet be rolled back) all come from `work` and nothing is kept.
   */
  of(ids: number[], mark: LedgerMark | null, work: (missing: number[]) => Map<number, Worked<T>>): Map<number, T> {
    if (!mark || !this.keeping() || !sweepTo(mark)) return new Map([...work(ids)].map(([id, w]) => [id, w.value]));
    return this.keptOrWorked(ids, work);
  }
}
