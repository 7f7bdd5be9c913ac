import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { lineageEdges, lots } from "@/db/schema";
import { getDb } from "../platform/db";
import { visibleTo } from "../ledger/lots";
import type { SessionUser } from "../accounts/session";

const other = alias(lots, "other");
const self = alias(lots, "self");

/** A neighbour the reader may not see keeps its kind and share, never its code. */
export type Neighbour = { code: string | null; kind: string; share: number; visible: boolean };

/**
 * One step back and one step forward (ISO 22005, EU 178/2002 Art. 18): the lots this one
 * was made from with the share of its content each gave, and the lots it went into with
 * the share of their content it gave. Reversed edges cancel, so corrected links drop out.
 */
export function neighbours(actor: SessionUser, lotId: number): { back: Neighbour[]; forward: Neighbour[] } {
  const db = getDb();
  const seen = (code: string) => db.select({ id: lots.id }).from(lots).where(and(eq(lots.code, code), visibleTo(actor))).get() !== undefined;
  const back = db
    .select({ code: other.code, kind: other.kind, share: sql<number>`sum(${lineageEdges.weight}) / max(${self.contentIn}, 1e-12)` })
    .from(lineageEdges)
    .innerJoin(other, eq(other.id, lineageEdges.parentLotId))
    .innerJoin(self, eq(self.id, lineageEdges.childLotId))
    .where(eq(lineageEdges.childLotId, lotId))
    .groupBy(other.id)
    .having(sql`abs(sum(${lineageEdges.weight})) > 1e-9`)
    .orderBy(sql`3 desc`)
    .all();
  const forward = db
    .select({ code: other.code, kind: other.kind, share: sql<number>`sum(${lineageEdges.weight}) / max(${other.contentIn}, 1e-12)` })
    .from(lineageEdges)
    .innerJoin(other, eq(other.id, lineageEdges.childLotId))
    .where(eq(lineageEdges.parentLotId, lotId))
    .groupBy(other.id)
    .having(sql`abs(sum(${lineageEdges.weight})) > 1e-9`)
    .orderBy(sql`3 desc`)
    .all();
  const mark = (rows: { code: string; kind: string; share: number }[]) => rows.map((r) => (seen(r.code) ? { ...r, visible: true } : { ...r, code: null, visible: false }));
  return { back: mark(back), forward: mark(forward) };
}
