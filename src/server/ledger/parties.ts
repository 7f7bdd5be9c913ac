import "server-only";
import { asc, eq } from "drizzle-orm";
import { generateIdFromEntropySize } from "lucia";
import { parties } from "@/db/schema";
import { canManageParties } from "@/domain/permissions";
import type { PartyKind } from "@/domain/roles";
import type { PartyInput } from "@/lib/validation/people";
import { recordAudit } from "../records/audit";
import { getDb } from "../platform/db";
import { forbidden, notFound } from "../platform/errors";
import type { SessionUser } from "../accounts/session";

export function listParties(kind?: PartyKind) {
  const q = getDb().select().from(parties);
  return (kind ? q.where(eq(parties.kind, kind)) : q).orderBy(asc(parties.name)).all();
}

export function getParty(id: string) {
  return getDb().select().from(parties).where(eq(parties.id, id)).get() ?? null;
}

export function createParty(actor: SessionUser, input: PartyInput) {
  if (!canManageParties(actor)) throw forbidden();
  const id = generateIdFromEntropySize(10);
  getDb().transaction((tx) => {
    tx.insert(parties).values({ id, ...input, createdAt: new Date() }).run();
    recordAudit(tx, { userId: actor.id, action: "party.created", subject: id, detail: { name: input.name, kind: input.kind } });
  });
  return { id };
}

/** Master data may change (a new address); the audit log keeps what it was before. */
export function updateParty(actor: SessionUser, id: string, input: PartyInput) {
  if (!canManageParties(actor)) throw forbidden();
  getDb().transaction((tx) => {
    const before = tx.select().from(parties).where(eq(parties.id, id)).get();
    if (!before) throw notFound("errors.partyNotFound");
    // The kind stays: users and contracts hang on it.
    const { kind: _kind, ...changes } = input;
    tx.update(parties).set(changes).where(eq(parties.id, id)).run();
    recordAudit(tx, { userId: actor.id, action: "party.updated", subject: id, detail: { before, after: input } });
  });
  return { id };
}
