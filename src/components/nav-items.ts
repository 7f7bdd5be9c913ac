import { can, type Actor, type Permission } from "@/domain/permissions";
import { STEP_RULES } from "@/domain/steps";

export type NavItem = { href: string; label: string; show: (actor: Actor) => boolean };

const everyone = () => true;
const IMPORTERS: Permission[] = ["harvests:record-own", "harvests:record-any", "polishing:record", "brewing:record"];

/** Office navigation; an entry shows only to roles the server would let through. */
export const OFFICE_NAV: NavItem[] = [
  { href: "/overview", label: "overview", show: (a) => can(a, "users:manage") },
  { href: "/fields", label: "fields", show: (a) => can(a, "fields:read-all") || can(a, "fields:write-own") },
  { href: "/lots", label: "lots", show: everyone },
  { href: "/labels", label: "labels", show: everyone },
  { href: "/import", label: "import", show: (a) => IMPORTERS.some((p) => can(a, p)) },
  { href: "/records/transactions", label: "transactions", show: everyone },
  { href: "/mill", label: "mill", show: (a) => can(a, "polishing:record") },
  { href: "/account", label: "account", show: (a) => can(a, "ledger:read-own") },
  { href: "/suppliers", label: "suppliers", show: (a) => can(a, "ledger:read-all") },
  { href: "/receive", label: "receive", show: (a) => can(a, "polishing:record") || can(a, "brewing:record") },
  { href: "/dispatch", label: "dispatch", show: (a) => STEP_RULES.shipping.permission.some((p) => can(a, p)) },
  { href: "/scan", label: "scan", show: (a) => can(a, "brewing:record") },
  { href: "/provenance", label: "provenance", show: (a) => can(a, "provenance:read") },
  { href: "/recall", label: "recall", show: (a) => can(a, "provenance:read") || can(a, "records:read-all") },
  { href: "/brew-days", label: "brewDays", show: (a) => can(a, "records:read-all") },
  { href: "/records", label: "records", show: (a) => can(a, "audit:read") },
  { href: "/admin/parties", label: "parties", show: (a) => can(a, "setup:read") },
  { href: "/admin/users", label: "users", show: (a) => can(a, "setup:read") },
  { href: "/admin/outbox", label: "outbox", show: (a) => can(a, "outbox:read") },
  { href: "/admin/settings", label: "settings", show: (a) => can(a, "setup:read") },
  { href: "/admin/products", label: "products", show: (a) => can(a, "settings:manage") },
];

export function navFor(actor: Actor): NavItem[] {
  return OFFICE_NAV.filter((item) => item.show(actor));
}
