import "server-only";
import { eq, or } from "drizzle-orm";
import { fields, lots, parties, users } from "@/db/schema";
import { getDb } from "../platform/db";

/** Turns the ids an audit line points at into what a reader recognises: names and lot codes. */
export type AuditNames = {
  user(id: string | null): string;
  party(id: string): string;
  lot(id: number): string;
  /** An audit_log subject: a user, party, field or lot (by id or code); "—" when it names none. */
  subject(subject: string): string;
};

const UNKNOWN = "—";

/** Users, parties and fields are small master tables, read once per page; lots are looked up as met. */
export function loadAuditNames(): AuditNames {
  const db = getDb();
  const userNames = new Map(db.select({ id: users.id, name: users.name }).from(users).all().map((r) => [r.id, r.name]));
  const partyNames = new Map(db.select({ id: parties.id, name: parties.name }).from(parties).all().map((r) => [r.id, r.name]));
  const fieldNames = new Map(db.select({ id: fields.id, name: fields.name }).from(fields).all().map((r) => [r.id, r.name]));
  const lotCodes = new Map<string, string | null>();
  const lotCode = (key: string) => {
    if (!lotCodes.has(key)) {
      const byId = /^\d+$/.test(key) ? eq(lots.id, Number(key)) : undefined;
      const row = db.select({ code: lots.code }).from(lots).where(byId ? or(byId, eq(lots.code, key)) : eq(lots.code, key)).get();
      lotCodes.set(key, row?.code ?? null);
    }
    return lotCodes.get(key) ?? null;
  };
  return {
    user: (id) => (id ? (userNames.get(id) ?? UNKNOWN) : UNKNOWN),
    party: (id) => partyNames.get(id) ?? UNKNOWN,
    lot: (id) => lotCode(String(id)) ?? UNKNOWN,
    subject: (s) => userNames.get(s) ?? partyNames.get(s) ?? fieldNames.get(s) ?? lotCode(s) ?? UNKNOWN,
  };
}
