import "server-only";
import { and, eq, isNotNull, isNull, ne } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { parties, sessions, users } from "@/db/schema";
import { canManageUsers } from "@/domain/permissions";
import { PARTY_KIND_FOR_ROLE, type Role } from "@/domain/roles";
import type { Translate } from "@/lib/validation/field-errors";
import { recordAudit } from "../records/audit";
import { getDb } from "../platform/db";
import { AppError, forbidden, invalid, notFound } from "../platform/errors";
import type { SessionUser } from "./session";

/** Active: has set a password and is not deactivated; an invitation nobody took up signs no one in. */
const ACTIVE = and(isNull(users.disabledAt), isNotNull(users.passwordHash));

function targetOf(tx: DbOrTx, userId: string) {
  const row = tx.select().from(users).where(eq(users.id, userId)).get();
  if (!row) throw notFound("errors.userNotFound");
  return row;
}

/**
 * Someone must always be able to manage users: the last active admin may not be deactivated or
 * given another role (by themselves — nobody else is left to do it). Checked in the same
 * transaction as the change, so two admins demoting each other at once cannot both succeed.
 */
function keepAnAdmin(tx: DbOrTx, target: typeof users.$inferSelect, t: Translate, field: string) {
  if (target.role !== "admin" || target.disabledAt || !target.passwordHash) return;
  const other = tx.select({ id: users.id }).from(users).where(and(ACTIVE, eq(users.role, "admin"), ne(users.id, target.id))).get();
  if (!other) throw new AppError("conflict", "errors.lastAdmin", { [field]: [t("validation.lastAdmin")] });
}

/** Ends every session of the user at once: the next request of theirs is signed out. */
const endSessions = (tx: DbOrTx, userId: string) => tx.delete(sessions).where(eq(sessions.userId, userId)).run();

export function deactivateUser(actor: SessionUser, userId: string, t: Translate) {
  if (!canManageUsers(actor)) throw forbidden();
  return getDb().transaction((tx) => {
    const target = targetOf(tx, userId);
    if (target.disabledAt) return { name: target.name };
    keepAnAdmin(tx, target, t, "userId");
    tx.update(users).set({ disabledAt: new Date() }).where(eq(users.id, userId)).run();
    endSessions(tx, userId);
    recordAudit(tx, { userId: actor.id, action: "user.deactivated", subject: userId });
    return { name: target.name };
  });
}

export function reactivateUser(actor: SessionUser, userId: string) {
  if (!canManageUsers(actor)) throw forbidden();
  return getDb().transaction((tx) => {
    const target = targetOf(tx, userId);
    if (!target.disabledAt) return { name: target.name };
    tx.update(users).set({ disabledAt: null }).where(eq(users.id, userId)).run();
    recordAudit(tx, { userId: actor.id, action: "user.reactivated", subject: userId });
    return { name: target.name };
  });
}

/** A new role must fit the user's party (PARTY_KIND_FOR_ROLE); the user signs in again under it. */
export function changeUserRole(actor: SessionUser, userId: string, role: Role, t: Translate) {
  if (!canManageUsers(actor)) throw forbidden();
  return getDb().transaction((tx) => {
    const target = targetOf(tx, userId);
    if (target.role === role) return { name: target.name };
    const party = tx.select({ kind: parties.kind }).from(parties).where(eq(parties.id, target.partyId)).get()!;
    if (party.kind !== PARTY_KIND_FOR_ROLE[role]) {
      throw invalid({ role: [t("validation.roleNeedsParty", { kind: t(`parties.kinds.${PARTY_KIND_FOR_ROLE[role]}`) })] });
    }
    keepAnAdmin(tx, target, t, "role");
    tx.update(users).set({ role }).where(eq(users.id, userId)).run();
    endSessions(tx, userId);
    recordAudit(tx, { userId: actor.id, action: "user.role-changed", subject: userId, detail: { from: target.role, to: role } });
    return { name: target.name };
  });
}
