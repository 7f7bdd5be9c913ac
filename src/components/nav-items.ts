import { can, HOME_FOR_ROLE, type Actor, type Permission } from "@/domain/permissions";

export type NavItem = { href: string; label: string; permission: Permission | null };

/** Office navigation; an entry shows only to roles the server would let through. */
export const OFFICE_NAV: NavItem[] = [
  { href: "/overview", label: "overview", permission: "users:manage" },
  { href: "/fields", label: "fields", permission: null },
  { href: "/mill", label: "mill", permission: "polishing:record" },
  { href: "/scan", label: "scan", permission: "brewing:record" },
  { href: "/provenance", label: "provenance", permission: "provenance:read" },
  { href: "/records", label: "records", permission: "audit:read" },
  { href: "/admin/parties", label: "parties", permission: "parties:manage" },
  { href: "/admin/users", label: "users", permission: "users:manage" },
  { href: "/admin/outbox", label: "outbox", permission: "outbox:read" },
];

export function navFor(actor: Actor): NavItem[] {
  return OFFICE_NAV.filter((item) =>
    item.permission ? can(actor, item.permission) : can(actor, "fields:read-all") || can(actor, "fields:write-own"),
  );
}

export const homeFor = (actor: Actor) => HOME_FOR_ROLE[actor.role];
