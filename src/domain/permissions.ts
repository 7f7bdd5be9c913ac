import type { Role } from "./roles";

/**
 * What each role may do. The server enforces these; the UI uses the same
 * predicates to hide what a person cannot use.
 */
export const PERMISSIONS = [
  "users:manage",
  "parties:manage",
  "outbox:read",
  "audit:read",
  "fields:read-all",
  "fields:write-own",
  "fields:write-any",
  "harvests:record-own",
  "harvests:record-any",
  "harvests:dispatch-own",
  "polishing:record",
  "brewing:record",
  "provenance:read",
  "records:read-all",
  "ledger:read-own",
  "ledger:read-all",
  "ledger:manage",
  "lots:act-any",
  "records:correct",
  "settings:manage",
  "attachments:add",
  // Reading the office set-up (settings, users, parties) without changing it: the admin and the auditor.
  "setup:read",
] as const;
export type Permission = (typeof PERMISSIONS)[number];

export const ROLE_PERMISSIONS: Record<Role, readonly Permission[]> = {
  admin: [
    "users:manage",
    "parties:manage",
    "outbox:read",
    "audit:read",
    "fields:read-all",
    "fields:write-any",
    "harvests:record-any",
    "polishing:record",
    "brewing:record",
    "provenance:read",
    "records:read-all",
    "ledger:read-all",
    "ledger:manage",
    "lots:act-any",
    "records:correct",
    "settings:manage",
    "attachments:add",
    "setup:read",
  ],
  brewer: ["fields:read-all", "brewing:record", "provenance:read", "records:read-all", "attachments:add"],
  grower: ["fields:write-own", "harvests:record-own", "harvests:dispatch-own", "ledger:read-own", "attachments:add"],
  miller: ["polishing:record", "ledger:read-own", "attachments:add"],
  sales: ["fields:read-all", "provenance:read", "records:read-all"],
  auditor: ["audit:read", "fields:read-all", "provenance:read", "records:read-all", "ledger:read-all", "setup:read"],
};

export type Actor = { id: string; role: Role; partyId: string };

export function can(actor: Pick<Actor, "role"> | null | undefined, permission: Permission): boolean {
  if (!actor) return false;
  return ROLE_PERMISSIONS[actor.role].includes(permission);
}

export const canManageUsers = (actor: Actor | null) => can(actor, "users:manage");
export const canManageParties = (actor: Actor | null) => can(actor, "parties:manage");
export const canReadOutbox = (actor: Actor | null) => can(actor, "outbox:read");
export const canReadAudit = (actor: Actor | null) => can(actor, "audit:read");

/** A grower works only on fields of their own party; admin on any grower's. */
export function canRecordOnField(actor: Actor | null, field: { growerId: string }): boolean {
  if (can(actor, "fields:write-any")) return true;
  return can(actor, "fields:write-own") && actor!.partyId === field.growerId;
}

export function canReadFieldsOf(actor: Actor | null, growerId: string): boolean {
  if (can(actor, "fields:read-all")) return true;
  return can(actor, "fields:write-own") && actor!.partyId === growerId;
}

/** Suppliers see only their own money; the office (and the auditor, reading) sees everyone's. */
export function canReadLedgerOf(actor: Actor | null, partyId: string): boolean {
  if (can(actor, "ledger:manage") || can(actor, "ledger:read-all")) return true;
  return can(actor, "ledger:read-own") && actor!.partyId === partyId;
}

/** Where each role lands after signing in. */
export const HOME_FOR_ROLE: Record<Role, string> = {
  admin: "/overview",
  auditor: "/records",
  grower: "/fields",
  miller: "/mill",
  brewer: "/scan",
  sales: "/provenance",
};

/** Holding lots after a recall, and releasing them: the office (it acts on any party's lots). */
export const canHoldLots = (actor: Actor | null) => can(actor, "lots:act-any");

/** Recording on a lot: the party holding it, or the office on anyone's behalf. */
export function canActOnLot(actor: Actor | null, lot: { partyId: string }): boolean {
  if (can(actor, "lots:act-any")) return true;
  return Boolean(actor) && actor!.partyId === lot.partyId;
}

/**
 * Whether a lot exists as far as this user can tell: roles that read all records see every
 * lot, others the lots their party holds or made, or a dispatch addressed to it (the same
 * rule as `visibleTo` in src/server/ledger/lots.ts). A lot outside it answers as unknown, never as forbidden.
 */
export function canSeeLot(actor: Actor | null, lot: { partyId: string; originPartyId: string; inTransitTo?: string | null }): boolean {
  if (can(actor, "records:read-all")) return true;
  return Boolean(actor) && (actor!.partyId === lot.partyId || actor!.partyId === lot.originPartyId || actor!.partyId === lot.inTransitTo);
}

/**
 * Sending a lot to another party (a dispatch with its slip): the holder's mill or brewery staff,
 * the office, or a grower sending a harvest of its own — the sender's word a receipt needs.
 */
export function canDispatchLot(actor: Actor | null, lot: { kind: string; partyId: string }): boolean {
  if (!canActOnLot(actor, lot)) return false;
  if (can(actor, "polishing:record") || can(actor, "brewing:record")) return true;
  return can(actor, "harvests:dispatch-own") && lot.kind === "harvest";
}

// Corrections (who may undo an event, before and after its lots change hands): ./corrections.ts.

/**
 * Who may attach a certificate or report to a lot: whoever may record on it (its holder,
 * the office), or the party that made it — a grower still files the inspection
 * certificate of a harvest the mill now holds. Sales and auditors read, never add.
 */
export function canAttachToLot(actor: Actor | null, lot: { partyId: string; originPartyId: string }): boolean {
  if (!can(actor, "attachments:add")) return false;
  return canActOnLot(actor, lot) || actor!.partyId === lot.originPartyId;
}

/** Roles that record any event at all (each step checks its own permission as well). */
export function canRecordEvents(actor: Actor | null): boolean {
  return (["polishing:record", "brewing:record", "harvests:record-own", "harvests:record-any", "records:correct"] as const).some((p) => can(actor, p));
}
