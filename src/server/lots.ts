import "server-only";
import { and, desc, eq, gt } from "drizzle-orm";
import { fields, lots, parties } from "@/db/schema";
import { can } from "@/domain/permissions";
import { getDb } from "./db";
import type { SessionUser } from "./session";

const cardColumns = {
  code: lots.code,
  kind: lots.kind,
  unit: lots.unit,
  onHand: lots.onHand,
  variety: lots.variety,
  cropYear: lots.cropYear,
  grade: lots.grade,
  polishingRatioPct: lots.polishingRatioPct,
  partyName: parties.name,
  fieldName: fields.name,
  region: fields.region,
  createdAt: lots.createdAt,
};

export type LotCard = { code: string; kind: string; unit: string; onHand: number; variety: string | null; cropYear: number | null; grade: string | null; polishingRatioPct: number | null; partyName: string; fieldName: string | null; region: string | null; createdAt: Date };

/** A lot as the scan and provenance screens show it; suppliers see only lots they hold. */
export function findLotCard(actor: SessionUser, code: string): LotCard | null {
  const where = can(actor, "records:read-all") ? eq(lots.code, code) : and(eq(lots.code, code), eq(lots.partyId, actor.partyId));
  return getDb().select(cardColumns).from(lots).innerJoin(parties, eq(parties.id, lots.partyId)).leftJoin(fields, eq(fields.id, lots.fieldId)).where(where).get() ?? null;
}

/** Harvest lots a mill holds with rice still on hand: its polishing queue. */
export function listAwaitingPolishing(millPartyId: string | null): LotCard[] {
  const held = millPartyId ? eq(lots.partyId, millPartyId) : eq(parties.kind, "mill");
  return getDb()
    .select(cardColumns)
    .from(lots)
    .innerJoin(parties, eq(parties.id, lots.partyId))
    .leftJoin(fields, eq(fields.id, lots.fieldId))
    .where(and(eq(lots.kind, "harvest"), gt(lots.onHand, 0), held))
    .orderBy(desc(lots.createdAt))
    .all();
}
