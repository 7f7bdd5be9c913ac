import "server-only";
import { and, asc, desc, eq, gt, like, lt, or, sql, type Placeholder, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { fields, lots, parties } from "@/db/schema";
import { can } from "@/domain/permissions";
import { getDb } from "../platform/db";
import { notFound } from "../platform/errors";
import { currentHold, type Hold } from "../trace/holds";
import { prepared } from "../platform/prepared";
import type { SessionUser } from "../accounts/session";

const holder = alias(parties, "holder");
// The party a dispatched lot is on its way to (the floor card says so instead of offering steps).
const transit = alias(parties, "transit");

/**
 * Which lots a user may see: everything for roles that read all records, else those their party
 * holds or made, and a lot dispatched to it (canSeeLot in src/domain/permissions.ts, the same rule).
 */
export function visibleTo(actor: SessionUser, party: string | Placeholder = actor.partyId): SQL | undefined {
  if (can(actor, "records:read-all")) return undefined;
  return or(eq(lots.partyId, party), eq(lots.originPartyId, party), eq(lots.inTransitTo, party));
}

const lotColumns = {
  id: lots.id,
  code: lots.code,
  kind: lots.kind,
  unit: lots.unit,
  quantity: lots.quantityIn,
  onHand: lots.onHand,
  variety: lots.variety,
  cropYear: lots.cropYear,
  grade: lots.grade,
  moisturePct: lots.moisturePct,
  polishingRatioPct: lots.polishingRatioPct,
  attributes: lots.attributes,
  partyId: holder.id,
  partyName: holder.name,
  transitId: transit.id,
  transitName: transit.name,
  fieldId: fields.id,
  fieldName: fields.name,
  region: fields.region,
  createdAt: lots.createdAt,
};

type Row = { [K in keyof typeof lotColumns]: (typeof lotColumns)[K]["_"]["data"] | null } & { id: number; code: string; kind: string; unit: string; quantity: number; onHand: number; attributes: string; createdAt: Date };

function selectLots() {
  return getDb().select(lotColumns).from(lots).innerJoin(holder, eq(holder.id, lots.partyId)).leftJoin(transit, eq(transit.id, lots.inTransitTo)).leftJoin(fields, eq(fields.id, lots.fieldId));
}

/** The API's Lot shape (../shared/api.md). */
export function toApiLot(r: Row) {
  const createdAt = r.createdAt.toISOString();
  return {
    code: r.code,
    kind: r.kind,
    unit: r.unit,
    quantity: r.quantity,
    onHand: r.onHand,
    variety: r.variety ?? undefined,
    cropYear: r.cropYear ?? undefined,
    grade: r.grade ?? undefined,
    moisturePct: r.moisturePct ?? undefined,
    polishingRatioPct: r.polishingRatioPct ?? undefined,
    party: { id: r.partyId!, name: r.partyName! },
    inTransitTo: r.transitId ? { id: r.transitId, name: r.transitName! } : undefined,
    field: r.fieldId ? { id: r.fieldId, name: r.fieldName!, region: r.region! } : undefined,
    attributes: JSON.parse(r.attributes) as Record<string, unknown>,
    // For the floor's "days rested since polishing" (polished lots only).
    polishedAt: r.kind === "polished" ? createdAt : undefined,
    createdAt,
    // Filled for one lot read by code (getLot, findLot): the floor card and the lot page show it.
    hold: undefined as Hold | undefined,
  };
}
export type ApiLot = ReturnType<typeof toApiLot>;

/** One lot by code as `actor` may see it; the statement is prepared once per visibility rule. */
function lotByCode(actor: SessionUser, code: string): Row | undefined {
  const all = can(actor, "records:read-all");
  const statement = prepared(getDb(), all ? "api-lot-by-code:all" : "api-lot-by-code:party", (db) =>
    db
      .select(lotColumns)
      .from(lots)
      .innerJoin(holder, eq(holder.id, lots.partyId))
      .leftJoin(transit, eq(transit.id, lots.inTransitTo))
      .leftJoin(fields, eq(fields.id, lots.fieldId))
      .where(and(eq(lots.code, sql.placeholder("code")), visibleTo(actor, sql.placeholder("party"))))
      .prepare(),
  );
  return statement.get({ code, party: actor.partyId }) as Row | undefined;
}

export function getLot(actor: SessionUser, code: string): ApiLot {
  const row = lotByCode(actor, code);
  if (!row) throw notFound({ key: "errors.lotNotFound", values: { code } });
  return { ...toApiLot(row), hold: currentHold(getDb(), row.id) ?? undefined };
}

export function findLot(actor: SessionUser, code: string): ApiLot | null {
  const row = lotByCode(actor, code);
  return row ? { ...toApiLot(row), hold: currentHold(getDb(), row.id) ?? undefined } : null;
}

export function findLotId(actor: SessionUser, code: string): number | null {
  return getDb().select({ id: lots.id }).from(lots).where(and(eq(lots.code, code), visibleTo(actor))).get()?.id ?? null;
}

export const LOT_SORTS = ["createdAt", "code", "kind", "variety", "cropYear", "grade", "onHand"] as const;
const SORT_COLUMNS = { createdAt: lots.id, code: lots.code, kind: lots.kind, variety: lots.variety, cropYear: lots.cropYear, grade: lots.grade, onHand: lots.onHand };
export type LotQuery = {
  kind?: string;
  q?: string;
  variety?: string;
  cropYear?: number;
  partyId?: string;
  grade?: string;
  sort?: (typeof LOT_SORTS)[number];
  dir?: "asc" | "desc";
  limit: number;
  offset?: number;
  cursor?: number;
};

/** Lots for tables and the API: filters, search on code, keyset pages by id (newest first). */
export function listLots(actor: SessionUser, query: LotQuery) {
  const filters = and(
    visibleTo(actor),
    query.kind ? eq(lots.kind, query.kind as never) : undefined,
    // A code, or a tank's name ("Tank 3" finds the tank lots of that tank).
    query.q ? or(like(lots.code, `%${query.q.replace(/[%_]/g, "")}%`), and(eq(lots.kind, "tank"), sql`lower(json_extract(${lots.attributes}, '$.tankName')) = ${query.q.trim().replace(/\s+/g, " ").toLowerCase()}`)) : undefined,
    query.variety ? eq(lots.variety, query.variety) : undefined,
    query.cropYear ? eq(lots.cropYear, query.cropYear) : undefined,
    query.partyId ? eq(lots.partyId, query.partyId) : undefined,
    query.grade ? eq(lots.grade, query.grade) : undefined,
  );
  const where = and(filters, query.cursor ? lt(lots.id, query.cursor) : undefined);
  const column = SORT_COLUMNS[query.sort ?? "createdAt"];
  const direction = query.dir ?? (query.sort && query.sort !== "createdAt" && query.sort !== "onHand" ? "asc" : "desc");
  const keyset = !query.sort || (query.sort === "createdAt" && direction === "desc");
  const rows = selectLots()
    .where(keyset ? where : filters)
    .orderBy(direction === "asc" ? asc(column) : desc(column), desc(lots.id))
    .limit(query.limit + 1)
    .offset(query.offset ?? 0)
    .all() as Row[];
  const page = rows.slice(0, query.limit);
  const total = getDb().select({ n: sql<number>`count(*)` }).from(lots).where(filters).get()!.n;
  return {
    items: page.map(toApiLot),
    // Keyset cursors for the default order (newest first); other orders page by offset.
    nextCursor: rows.length > query.limit && keyset ? String(page[page.length - 1]!.id) : null,
    total,
  };
}

/** Harvest lots a mill holds with rice still on hand: its polishing queue. */
export function listAwaitingPolishing(millPartyId: string | null) {
  const held = millPartyId ? eq(lots.partyId, millPartyId) : eq(holder.kind, "mill");
  return (selectLots().where(and(eq(lots.kind, "harvest"), gt(lots.onHand, 0), held)).orderBy(desc(lots.createdAt)).all() as Row[]).map(toApiLot);
}
