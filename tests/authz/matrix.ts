// The authorisation matrix: every page, route handler method and server action of app/ against
// every role and anonymous, with what each may expect. tests/integration/authz-matrix.test.ts
// walks it, and fails when app/ gains an entry point this table does not name (or loses one it does).
import type { Permission } from "@/domain/permissions";
import type { Role } from "@/domain/roles";

export const WHO = ["anonymous", "admin", "brewer", "grower", "miller", "sales", "auditor"] as const;
export type Who = (typeof WHO)[number];

/** The demo user of each role (src/server/records/seed.ts): grower is Ikeda Farm, miller is Shirotae Polishing Works. */
export const DEMO_EMAIL: Record<Role, string> = {
  admin: "admin@example.com",
  brewer: "brewer@example.com",
  grower: "grower@example.com",
  miller: "miller@example.com",
  sales: "sales@example.com",
  auditor: "auditor@example.com",
};

/**
 * - "ok": a 2xx (routes), the page renders, the action runs;
 * - "401" / "403" / "404" / "422": that status, in the API's error shape (for actions: the form
 *   state's message for that error code);
 * - "404-if-not-own" (pages): renders for lots the role may see, "not found" for any other lot;
 * - "redirect:/sign-in", "redirect:home": a redirect to the sign-in page or to the role's home.
 */
export type Outcome = "ok" | "401" | "403" | "404" | "422" | "404-if-not-own" | "redirect:/sign-in" | "redirect:home";
export type Row = Record<Who, Outcome>;

/** One row, cells in the order of WHO: anonymous, admin, brewer, grower, miller, sales, auditor. */
function o(...cells: [Outcome, Outcome, Outcome, Outcome, Outcome, Outcome, Outcome]): Row {
  return Object.fromEntries(WHO.map((who, i) => [who, cells[i]])) as Row;
}

// Seeded lots the probes name (src/server/records/seed-season.ts, seed-brewing.ts):
/** Polished rice held by the brewery, made by the mill: visible to the roles that read all records and to the mill. */
const POLISHED = "P26-0001";
/** A harvest of Ikeda Farm (the demo grower), now held by the mill: visible to every signed-in role. */
const IKEDA_HARVEST = "H26-0001";
/** The first of `select code from lots where kind = 'bottled'`, filled in at run time. */
export const BOTTLED = "{bottled}";
/** The id of an attachment the test uploads to P26-0001 before walking the table. */
export const ATTACHMENT = "{attachment}";
/** A lot code no lot has ("ZZ" is no kind's prefix). */
const UNKNOWN_LOT = "ZZ99-0001";

// ───────────────────────────── route handlers ─────────────────────────────

export type HttpMethod = "GET" | "POST" | "PUT" | "PATCH" | "DELETE" | "HEAD" | "OPTIONS";
export const HTTP_METHODS: readonly HttpMethod[] = ["GET", "POST", "PUT", "PATCH", "DELETE", "HEAD", "OPTIONS"];

export type RouteProbe = {
  file: string;
  method: HttpMethod;
  /** When one method is probed more than once (different bodies or lots). */
  variant?: string;
  /** Path and query; BOTTLED and ATTACHMENT are filled in at run time. */
  url: string;
  params?: Record<string, string>;
  /** A JSON body. Write probes send bodies that can never be written (empty, or naming nothing that exists). */
  body?: unknown;
  /** Signs each role in afresh for this probe, because the probe ends the session. */
  session?: "throwaway";
  expect: Row;
  why: string;
};

export const routeKey = (p: Pick<RouteProbe, "file" | "method" | "variant">) => `${p.file} ${p.method}${p.variant ? ` (${p.variant})` : ""}`;

const SIGNED_IN = o("401", "ok", "ok", "ok", "ok", "ok", "ok");
/** On POLISHED: the grower neither holds nor made it, so it answers 404, never 403 (DEVELOPERS.md). */
const POLISHED_VISIBLE = o("401", "ok", "ok", "404", "ok", "ok", "ok");
const ADMIN_ONLY = o("401", "ok", "403", "403", "403", "403", "403");
const ADMIN_ONLY_WRITE = o("401", "422", "403", "403", "403", "403", "403");
/** provenance:read, or (recall) provenance:read or records:read-all: the same four roles. */
/** Ikeda Farm's money: the office, the auditor and Ikeda Farm itself; to the mill, an unknown party (404). */
const IKEDA_LEDGER = o("401", "ok", "403", "ok", "404", "403", "ok");
const OFFICE_READERS = o("401", "ok", "ok", "403", "403", "ok", "ok");

export const ROUTES: RouteProbe[] = [
  { file: "app/api/attachments/[id]/route.ts", method: "GET", url: `/api/attachments/${ATTACHMENT}`, params: { id: ATTACHMENT }, expect: POLISHED_VISIBLE, why: "any signed-in user who may see the attachment's lot (P26-0001); anyone else 404" },
  { file: "app/api/auth/sign-in/route.ts", method: "POST", url: "/api/auth/sign-in", body: {}, expect: o("422", "422", "422", "422", "422", "422", "422"), why: "public: the credentials are the check; an empty body is invalid for everyone" },
  { file: "app/api/auth/sign-out/route.ts", method: "POST", url: "/api/auth/sign-out", session: "throwaway", expect: o("ok", "ok", "ok", "ok", "ok", "ok", "ok"), why: "public: ends the caller's own session if there is one (204 either way); the test checks that session is dead afterwards" },
  { file: "app/api/claims/[code]/route.ts", method: "GET", url: `/api/claims/${BOTTLED}`, params: { code: BOTTLED }, expect: o("401", "ok", "ok", "404", "404", "ok", "ok"), why: "any signed-in user who may see the bottled lot; growers and the mill neither hold nor made it" },

  { file: "app/api/events/route.ts", method: "POST", variant: "empty body", url: "/api/events", body: {}, expect: o("401", "422", "422", "422", "422", "403", "403"), why: "the step decides the permission, but sales and auditors may record no step at all: 403 before validation" },
  { file: "app/api/events/route.ts", method: "POST", variant: "polishing an unknown lot", url: "/api/events", body: { step: "polishing", inputs: [{ lot: UNKNOWN_LOT, quantity: 1 }], outputs: [{ kind: "polished", quantity: 1 }] }, expect: o("401", "422", "403", "403", "422", "403", "403"), why: "polishing:record (admin, miller) passes the gate and meets the unknown lot (422)" },
  { file: "app/api/events/route.ts", method: "POST", variant: "soaking an unknown lot", url: "/api/events", body: { step: "soaking", inputs: [{ lot: UNKNOWN_LOT, quantity: 1 }], outputs: [{ kind: "soaked", quantity: 1 }] }, expect: o("401", "422", "422", "403", "403", "403", "403"), why: "brewing:record (admin, brewer) passes the gate" },
  { file: "app/api/events/route.ts", method: "POST", variant: "measuring an unknown lot", url: "/api/events", body: { step: "measuring", inputs: [{ lot: UNKNOWN_LOT, quantity: 0 }], measurements: [{ name: "moisturePct", value: 14, unit: "%" }] }, expect: o("401", "422", "422", "422", "422", "403", "403"), why: "measuring: anyone who records polishing, brewing or harvests" },

  { file: "app/api/fields/route.ts", method: "GET", url: "/api/fields", expect: o("401", "ok", "ok", "ok", "403", "ok", "ok"), why: "fields:read-all, or a grower's own (fields:write-own); the mill has neither" },
  { file: "app/api/fields/route.ts", method: "POST", variant: "empty body", url: "/api/fields", body: {}, expect: o("401", "422", "403", "422", "403", "403", "403"), why: "fields:write-any (admin) or fields:write-own (grower); the rest 403 before validation" },
  { file: "app/api/fields/route.ts", method: "POST", variant: "for an unknown grower", url: "/api/fields", body: { name: "Probe paddy", region: "Hyogo", areaHa: 1, growerId: "no-such-grower" }, expect: o("401", "422", "403", "403", "403", "403", "403"), why: "admin passes and meets the unknown grower (422); a grower naming another grower is refused (403)" },

  { file: "app/api/harvests/route.ts", method: "POST", variant: "empty body", url: "/api/harvests", body: {}, expect: o("401", "422", "403", "422", "403", "403", "403"), why: "harvests:record-any (admin) or -own (grower); the rest 403 before validation" },
  { file: "app/api/harvests/route.ts", method: "POST", variant: "on an unknown field", url: "/api/harvests", body: { fieldId: "no-such-field", variety: "Yamada Nishiki", cropYear: 2026, brownKg: 600, moisturePct: 14.8, grade: "1", bags: 10 }, expect: o("401", "422", "403", "422", "403", "403", "403"), why: "admin and grower pass the gate and meet the unknown field" },

  { file: "app/api/import/commit/route.ts", method: "POST", variant: "empty body", url: "/api/import/commit", body: {}, expect: o("401", "422", "422", "422", "422", "403", "403"), why: "whoever may import some kind (harvests: admin, grower; receipts: admin, brewer, miller)" },
  { file: "app/api/import/commit/route.ts", method: "POST", variant: "harvests, header only", url: "/api/import/commit", body: { kind: "harvests", header: ["field"], rows: [{ line: 2, cells: ["x"] }] }, expect: o("401", "422", "403", "422", "403", "403", "403"), why: "harvest imports: admin and grower (422: columns missing)" },
  { file: "app/api/import/commit/route.ts", method: "POST", variant: "receipts, header only", url: "/api/import/commit", body: { kind: "receipts", header: ["lot"], rows: [{ line: 2, cells: ["x"] }] }, expect: o("401", "422", "422", "403", "422", "403", "403"), why: "receipt imports: admin, brewer, miller (422: columns missing)" },
  { file: "app/api/import/preview/route.ts", method: "POST", variant: "empty body", url: "/api/import/preview", body: {}, expect: o("401", "422", "422", "422", "422", "403", "403"), why: "as commit" },
  { file: "app/api/import/preview/route.ts", method: "POST", variant: "harvests, header only", url: "/api/import/preview", body: { kind: "harvests", header: ["field"], rows: [{ line: 2, cells: ["x"] }] }, expect: o("401", "422", "403", "422", "403", "403", "403"), why: "as commit" },
  { file: "app/api/import/preview/route.ts", method: "POST", variant: "receipts, header only", url: "/api/import/preview", body: { kind: "receipts", header: ["lot"], rows: [{ line: 2, cells: ["x"] }] }, expect: o("401", "422", "422", "403", "422", "403", "403"), why: "as commit" },

  { file: "app/api/lots/[code]/attachments/route.ts", method: "GET", url: `/api/lots/${POLISHED}/attachments`, params: { code: POLISHED }, expect: POLISHED_VISIBLE, why: "whoever may see the lot" },
  { file: "app/api/lots/[code]/attachments/route.ts", method: "POST", variant: "JSON, not multipart", url: `/api/lots/${POLISHED}/attachments`, params: { code: POLISHED }, body: {}, expect: o("401", "422", "422", "404", "422", "403", "403"), why: "attachments:add and the lot's holder (brewery) or maker (mill); sales and auditors 403; the grower cannot see it (404)" },
  { file: "app/api/lots/[code]/events/route.ts", method: "GET", url: `/api/lots/${POLISHED}/events`, params: { code: POLISHED }, expect: POLISHED_VISIBLE, why: "whoever may see the lot" },
  { file: "app/api/lots/[code]/label.png/route.ts", method: "GET", url: `/api/lots/${POLISHED}/label.png`, params: { code: POLISHED }, expect: POLISHED_VISIBLE, why: "whoever may see the lot" },
  { file: "app/api/lots/[code]/lineage/route.ts", method: "GET", url: `/api/lots/${POLISHED}/lineage`, params: { code: POLISHED }, expect: POLISHED_VISIBLE, why: "whoever may see the lot (its graph page)" },
  { file: "app/api/lots/[code]/route.ts", method: "GET", url: `/api/lots/${POLISHED}`, params: { code: POLISHED }, expect: POLISHED_VISIBLE, why: "whoever may see the lot" },
  { file: "app/api/lots/[code]/route.ts", method: "GET", variant: "the grower's own harvest", url: `/api/lots/${IKEDA_HARVEST}`, params: { code: IKEDA_HARVEST }, expect: SIGNED_IN, why: "made by Ikeda Farm, held by the mill: both see it" },
  { file: "app/api/lots/route.ts", method: "GET", url: "/api/lots", expect: SIGNED_IN, why: "any signed-in user; the list is filtered to what each may see" },
  { file: "app/api/me/route.ts", method: "GET", url: "/api/me", expect: SIGNED_IN, why: "any signed-in user, about themselves" },
  { file: "app/api/parties/route.ts", method: "GET", url: "/api/parties", expect: ADMIN_ONLY, why: "parties:manage" },
  { file: "app/api/parties/route.ts", method: "POST", url: "/api/parties", body: {}, expect: ADMIN_ONLY_WRITE, why: "parties:manage, before validation" },
  { file: "app/api/provenance/[code]/sheet.pdf/route.ts", method: "GET", url: `/api/provenance/${BOTTLED}/sheet.pdf`, params: { code: BOTTLED }, expect: OFFICE_READERS, why: "provenance:read" },
  { file: "app/api/records/transactions.csv/route.ts", method: "GET", url: "/api/records/transactions.csv?from=2024-01-01&to=2026-12-31", expect: SIGNED_IN, why: "any signed-in user; suppliers get only their own receipts and shipments" },
  { file: "app/api/trace/[code]/epcis/route.ts", method: "GET", url: `/api/trace/${POLISHED}/epcis`, params: { code: POLISHED }, expect: OFFICE_READERS, why: "provenance:read or records:read-all, before the lot is looked up" },
  { file: "app/api/trace/[code]/recall.csv/route.ts", method: "GET", url: `/api/trace/${POLISHED}/recall.csv`, params: { code: POLISHED }, expect: OFFICE_READERS, why: "as epcis" },
  { file: "app/api/trace/[code]/route.ts", method: "GET", url: `/api/trace/${POLISHED}?direction=backward`, params: { code: POLISHED }, expect: POLISHED_VISIBLE, why: "whoever may see the lot" },
  { file: "app/api/suppliers/[partyId]/ledger/route.ts", method: "GET", url: "/api/suppliers/grower-ikeda/ledger", params: { partyId: "grower-ikeda" }, expect: IKEDA_LEDGER, why: "the office and the auditor read any supplier; a supplier only its own (Ikeda Farm is the demo grower)" },
  { file: "app/api/suppliers/[partyId]/payments/route.ts", method: "POST", url: "/api/suppliers/grower-ikeda/payments", params: { partyId: "grower-ikeda" }, body: {}, expect: ADMIN_ONLY_WRITE, why: "ledger:manage, before validation" },
  { file: "app/api/suppliers/[partyId]/payments/[entryId]/reversal/route.ts", method: "POST", url: "/api/suppliers/grower-ikeda/payments/1/reversal", params: { partyId: "grower-ikeda", entryId: "1" }, body: {}, expect: ADMIN_ONLY_WRITE, why: "ledger:manage, before validation (the reason), before the payment is looked up" },
  { file: "app/api/suppliers/[partyId]/adjustments/route.ts", method: "POST", url: "/api/suppliers/grower-ikeda/adjustments", params: { partyId: "grower-ikeda" }, body: {}, expect: ADMIN_ONLY_WRITE, why: "ledger:manage, before validation" },
  { file: "app/api/suppliers/[partyId]/list.csv/route.ts", method: "GET", url: "/api/suppliers/grower-ikeda/list.csv", params: { partyId: "grower-ikeda" }, expect: IKEDA_LEDGER, why: "as the ledger: the account's list of deliveries or runs" },
  { file: "app/api/suppliers/[partyId]/statements/route.ts", method: "GET", url: "/api/suppliers/grower-ikeda/statements", params: { partyId: "grower-ikeda" }, expect: IKEDA_LEDGER, why: "as the ledger" },
  { file: "app/api/suppliers/[partyId]/statements/route.ts", method: "POST", url: "/api/suppliers/grower-ikeda/statements", params: { partyId: "grower-ikeda" }, body: {}, expect: ADMIN_ONLY_WRITE, why: "ledger:manage, before validation" },
  { file: "app/api/suppliers/[partyId]/statements/[number]/statement.pdf/route.ts", method: "GET", url: "/api/suppliers/grower-ikeda/statements/S-2025-0001/statement.pdf", params: { partyId: "grower-ikeda", number: "S-2025-0001" }, expect: IKEDA_LEDGER, why: "as the ledger (a seeded statement of Ikeda Farm)" },
  { file: "app/api/suppliers/[partyId]/statements/[number]/statement.csv/route.ts", method: "GET", url: "/api/suppliers/grower-ikeda/statements/S-2025-0001/statement.csv", params: { partyId: "grower-ikeda", number: "S-2025-0001" }, expect: IKEDA_LEDGER, why: "as the ledger" },
  { file: "app/api/suppliers/[partyId]/statements/[number]/statement.csv/route.ts", method: "GET", variant: "an encoding not offered", url: "/api/suppliers/grower-ikeda/statements/S-2025-0001/statement.csv?encoding=latin1", params: { partyId: "grower-ikeda", number: "S-2025-0001" }, expect: o("401", "422", "403", "422", "404", "403", "422"), why: "who may read it first, then the encoding" },
  { file: "app/api/records/transactions.csv/route.ts", method: "GET", variant: "Shift_JIS", url: "/api/records/transactions.csv?from=2024-01-01&to=2026-12-31&encoding=shift_jis", expect: SIGNED_IN, why: "as the UTF-8 file" },
  { file: "app/api/trace/[code]/recall.csv/route.ts", method: "GET", variant: "an encoding not offered", url: `/api/trace/${POLISHED}/recall.csv?encoding=latin1`, params: { code: POLISHED }, expect: o("401", "422", "422", "403", "403", "422", "422"), why: "who may read recalls first, then the encoding" },
  { file: "app/api/users/route.ts", method: "GET", url: "/api/users", expect: ADMIN_ONLY, why: "users:manage" },
  { file: "app/api/users/route.ts", method: "POST", url: "/api/users", body: {}, expect: ADMIN_ONLY_WRITE, why: "users:manage, before validation" },
];

// ───────────────────────────── pages ─────────────────────────────

export type PageGuard =
  /** `requirePagePermission(permission)`. */
  | { by: "permission"; permission: Permission }
  /**
   * `requirePageUser()`, then (anyOf) `forbidden()` unless the role holds one of these, checked in
   * the page by `can(user, …)` or by the helper named in `source`; (ownLotsOnly) `notFound()` for a
   * lot the user may not see.
   */
  | { by: "user"; anyOf?: Permission[]; ownLotsOnly?: boolean; source?: string[] }
  /** No guard on purpose; `source` names what the page does instead. */
  | { by: "public"; why: string; source?: string[] };

export type PageEntry = { file: string; guard: PageGuard; expect: Row };

const PAGE_SIGNED_IN = o("redirect:/sign-in", "ok", "ok", "ok", "ok", "ok", "ok");
const PAGE_ADMIN_ONLY = o("redirect:/sign-in", "ok", "403", "403", "403", "403", "403");
const PAGE_BREWING = o("redirect:/sign-in", "ok", "ok", "403", "403", "403", "403");
const PAGE_READ_ALL = o("redirect:/sign-in", "ok", "ok", "403", "403", "ok", "ok");
const PAGE_SETUP_READERS = o("redirect:/sign-in", "ok", "403", "403", "403", "403", "ok");
const PAGE_OWN_LOTS = o("redirect:/sign-in", "ok", "ok", "404-if-not-own", "404-if-not-own", "ok", "ok");
const PUBLIC = o("ok", "ok", "ok", "ok", "ok", "ok", "ok");

export const PAGES: PageEntry[] = [
  { file: "app/page.tsx", guard: { by: "public", why: "the root only redirects: home of the signed-in role, else sign-in", source: ["currentUser()", "HOME_FOR_ROLE[user.role]", '"/sign-in"'] }, expect: o("redirect:/sign-in", "redirect:home", "redirect:home", "redirect:home", "redirect:home", "redirect:home", "redirect:home") },
  { file: "app/(auth)/forgot-password/page.tsx", guard: { by: "public", why: "asking for a reset link needs no session" }, expect: PUBLIC },
  { file: "app/(auth)/set-password/[token]/page.tsx", guard: { by: "public", why: "the link's token is the credential", source: ["findLinkHolder(token)"] }, expect: PUBLIC },
  { file: "app/(auth)/sign-in/page.tsx", guard: { by: "public", why: "the way in; a signed-in user is sent home", source: ["currentUser()", "redirect(HOME_FOR_ROLE[user.role])"] }, expect: o("ok", "redirect:home", "redirect:home", "redirect:home", "redirect:home", "redirect:home", "redirect:home") },
  { file: "app/(floor)/floor/[action]/page.tsx", guard: { by: "permission", permission: "brewing:record" }, expect: PAGE_BREWING },
  { file: "app/(floor)/scan/page.tsx", guard: { by: "permission", permission: "brewing:record" }, expect: PAGE_BREWING },
  { file: "app/(office)/admin/outbox/[id]/page.tsx", guard: { by: "permission", permission: "outbox:read" }, expect: PAGE_ADMIN_ONLY },
  { file: "app/(office)/admin/outbox/page.tsx", guard: { by: "permission", permission: "outbox:read" }, expect: PAGE_ADMIN_ONLY },
  // The auditor reads the office set-up; the forms on these pages show only to the admin.
  { file: "app/(office)/admin/parties/[id]/page.tsx", guard: { by: "permission", permission: "setup:read" }, expect: PAGE_SETUP_READERS },
  { file: "app/(office)/admin/parties/page.tsx", guard: { by: "permission", permission: "setup:read" }, expect: PAGE_SETUP_READERS },
  { file: "app/(office)/admin/settings/page.tsx", guard: { by: "permission", permission: "setup:read" }, expect: PAGE_SETUP_READERS },
  { file: "app/(office)/admin/users/page.tsx", guard: { by: "permission", permission: "setup:read" }, expect: PAGE_SETUP_READERS },
  { file: "app/(office)/brew-days/[date]/page.tsx", guard: { by: "permission", permission: "records:read-all" }, expect: PAGE_READ_ALL },
  { file: "app/(office)/admin/products/page.tsx", guard: { by: "permission", permission: "settings:manage" }, expect: PAGE_ADMIN_ONLY },
  { file: "app/(office)/search/page.tsx", guard: { by: "user", source: ["searchEverything(user"] }, expect: PAGE_SIGNED_IN },
  { file: "app/(office)/brew-days/page.tsx", guard: { by: "permission", permission: "records:read-all" }, expect: PAGE_READ_ALL },
  { file: "app/(office)/fields/page.tsx", guard: { by: "user", anyOf: ["fields:read-all", "fields:write-own"] }, expect: o("redirect:/sign-in", "ok", "ok", "ok", "403", "ok", "ok") },
  { file: "app/(office)/import/page.tsx", guard: { by: "user", anyOf: ["harvests:record-own", "harvests:record-any", "polishing:record", "brewing:record"], source: ["importKindsFor(user)"] }, expect: o("redirect:/sign-in", "ok", "ok", "ok", "ok", "403", "403") },
  { file: "app/(office)/labels/page.tsx", guard: { by: "user", source: ["listLabelCandidates(user)"] }, expect: PAGE_SIGNED_IN },
  { file: "app/(office)/lots/[code]/graph/page.tsx", guard: { by: "user", ownLotsOnly: true }, expect: PAGE_OWN_LOTS },
  { file: "app/(office)/lots/[code]/page.tsx", guard: { by: "user", ownLotsOnly: true }, expect: PAGE_OWN_LOTS },
  // The label's QR address: signed in, it sends on to /scan or /lots/{code}, each with its own guard.
  { file: "app/l/[code]/page.tsx", guard: { by: "user", source: ["signInFirst(", "isPhoneRequest("] }, expect: PAGE_SIGNED_IN },
  { file: "app/(office)/lots/page.tsx", guard: { by: "user" }, expect: PAGE_SIGNED_IN },
  { file: "app/(office)/mill/page.tsx", guard: { by: "permission", permission: "polishing:record" }, expect: o("redirect:/sign-in", "ok", "403", "403", "ok", "403", "403") },
  { file: "app/(office)/overview/page.tsx", guard: { by: "permission", permission: "users:manage" }, expect: PAGE_ADMIN_ONLY },
  { file: "app/(office)/provenance/page.tsx", guard: { by: "permission", permission: "provenance:read" }, expect: PAGE_READ_ALL },
  { file: "app/(office)/recall/page.tsx", guard: { by: "user", anyOf: ["provenance:read", "records:read-all"], source: ["canReadRecall(user)"] }, expect: PAGE_READ_ALL },
  { file: "app/(office)/dispatch/page.tsx", guard: { by: "user", anyOf: ["polishing:record", "brewing:record", "harvests:dispatch-own"] }, expect: o("redirect:/sign-in", "ok", "ok", "ok", "ok", "403", "403") },
  { file: "app/(office)/receive/page.tsx", guard: { by: "user", anyOf: ["polishing:record", "brewing:record"] }, expect: o("redirect:/sign-in", "ok", "ok", "403", "ok", "403", "403") },
  { file: "app/(office)/records/page.tsx", guard: { by: "permission", permission: "audit:read" }, expect: o("redirect:/sign-in", "ok", "403", "403", "403", "403", "ok") },
  { file: "app/(office)/records/transactions/page.tsx", guard: { by: "user" }, expect: PAGE_SIGNED_IN },
  { file: "app/(office)/account/page.tsx", guard: { by: "user", anyOf: ["ledger:read-own"] }, expect: o("redirect:/sign-in", "403", "403", "ok", "ok", "403", "403") },
  { file: "app/(office)/suppliers/page.tsx", guard: { by: "user", anyOf: ["ledger:read-all"] }, expect: o("redirect:/sign-in", "ok", "403", "403", "403", "403", "ok") },
  { file: "app/(office)/suppliers/[partyId]/page.tsx", guard: { by: "user", anyOf: ["ledger:read-all"] }, expect: o("redirect:/sign-in", "ok", "403", "403", "403", "403", "ok") },
  { file: "app/(public)/01/[gtin]/10/[lot]/page.tsx", guard: { by: "public", why: "the bottle's provenance page (GS1 Digital Link): only what the brewery marked public", source: ["publicProvenance("] }, expect: PUBLIC },
];

// ───────────────────────────── server actions ─────────────────────────────

export type ActionGuard =
  /** `requirePermission(permission)` first thing. */
  | { by: "permission"; permission: Permission }
  /** `requireUser()`, then the named server function checks the role (and ownership) itself. */
  | { by: "user"; checkedIn: string }
  | { by: "public"; why: string };

export type ActionEntry = {
  file: string;
  name: string;
  guard: ActionGuard;
  /** The form sent: always one that cannot be written (empty, or naming nothing). */
  form: Record<string, string>;
  session?: "throwaway";
  expect: Row;
};

export const actionKey = (a: Pick<ActionEntry, "file" | "name">) => `${a.file} ${a.name}`;

const FORM_ALL_422 = o("422", "422", "422", "422", "422", "422", "422");

export const ACTIONS: ActionEntry[] = [
  { file: "app/(auth)/forgot-password/actions.ts", name: "forgotPasswordAction", guard: { by: "public", why: "asking for a reset link; throttled per address and client, apart from failed sign-ins" }, form: {}, expect: FORM_ALL_422 },
  { file: "app/(auth)/set-password/[token]/actions.ts", name: "setPasswordAction", guard: { by: "public", why: "the link's token is the credential; links that do not work are throttled per client" }, form: {}, expect: FORM_ALL_422 },
  { file: "app/(auth)/sign-in/actions.ts", name: "signInAction", guard: { by: "public", why: "the way in" }, form: {}, expect: FORM_ALL_422 },
  { file: "app/(auth)/language/actions.ts", name: "setLanguageAction", guard: { by: "public", why: "the language switch: a visitor's choice goes to the cookie only; a signed-in person's setting is stored on their own row alone" }, form: {}, expect: FORM_ALL_422 },
  { file: "app/(auth)/sign-out/actions.ts", name: "signOutAction", guard: { by: "public", why: "ends only the caller's own session" }, form: {}, session: "throwaway", expect: o("redirect:/sign-in", "redirect:/sign-in", "redirect:/sign-in", "redirect:/sign-in", "redirect:/sign-in", "redirect:/sign-in", "redirect:/sign-in") },
  { file: "app/(office)/admin/parties/actions.ts", name: "createPartyAction", guard: { by: "permission", permission: "parties:manage" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/admin/parties/actions.ts", name: "updatePartyAction", guard: { by: "permission", permission: "parties:manage" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/admin/settings/actions.ts", name: "saveSettingsAction", guard: { by: "user", checkedIn: "saveSettings" }, form: {}, expect: ADMIN_ONLY_WRITE },
  // With no settings stored (the seed stores none) restoring the defaults writes nothing.
  { file: "app/(office)/admin/settings/actions.ts", name: "restoreDefaultsAction", guard: { by: "user", checkedIn: "restoreSettingDefaults" }, form: {}, expect: ADMIN_ONLY },
  { file: "app/(office)/admin/settings/actions.ts", name: "saveTankAction", guard: { by: "user", checkedIn: "saveTank" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/admin/settings/actions.ts", name: "addVarietyAction", guard: { by: "user", checkedIn: "addVariety" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/admin/settings/actions.ts", name: "removeVarietyAction", guard: { by: "user", checkedIn: "removeVariety" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/admin/users/actions.ts", name: "inviteUserAction", guard: { by: "permission", permission: "users:manage" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/admin/users/actions.ts", name: "deactivateUserAction", guard: { by: "permission", permission: "users:manage" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/admin/users/actions.ts", name: "reactivateUserAction", guard: { by: "permission", permission: "users:manage" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/admin/users/actions.ts", name: "changeRoleAction", guard: { by: "permission", permission: "users:manage" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/admin/products/actions.ts", name: "createProductAction", guard: { by: "user", checkedIn: "createProduct" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/fields/actions.ts", name: "createFieldAction", guard: { by: "user", checkedIn: "createField" }, form: {}, expect: o("401", "422", "403", "422", "403", "403", "403") },
  { file: "app/(office)/fields/actions.ts", name: "registerHarvestAction", guard: { by: "user", checkedIn: "registerHarvest" }, form: {}, expect: o("401", "422", "403", "422", "403", "403", "403") },
  { file: "app/(office)/lots/[code]/actions.ts", name: "correctEventAction", guard: { by: "user", checkedIn: "recordEvent" }, form: {}, expect: o("401", "422", "422", "422", "422", "422", "422") },
  // A shipment to a buyer: the shipping step's draw (brewing or polishing staff, the office); the form checks the buyer first.
  { file: "app/(office)/lots/[code]/actions.ts", name: "shipToBuyerAction", guard: { by: "user", checkedIn: "recordEvent" }, form: {}, expect: o("401", "422", "422", "403", "422", "403", "403") },
  { file: "app/(office)/lots/[code]/actions.ts", name: "releaseLotAction", guard: { by: "user", checkedIn: "releaseLot" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/recall/actions.ts", name: "holdRecallAction", guard: { by: "user", checkedIn: "holdRecall" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/recall/actions.ts", name: "releaseRecallAction", guard: { by: "user", checkedIn: "releaseRecall" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/suppliers/actions.ts", name: "saveRoundingAction", guard: { by: "user", checkedIn: "saveTaxRounding" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "setInvoiceNumberAction", guard: { by: "user", checkedIn: "setInvoiceNumber" }, form: {}, expect: o("401", "404", "403", "403", "403", "403", "403") },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "addGrowerContractAction", guard: { by: "user", checkedIn: "addGrowerContract" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "addMillContractAction", guard: { by: "user", checkedIn: "addMillContract" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "recordPaymentAction", guard: { by: "user", checkedIn: "recordPayment" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "reversePaymentAction", guard: { by: "user", checkedIn: "reversePayment" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "recordAdjustmentAction", guard: { by: "user", checkedIn: "recordAdjustment" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/suppliers/[partyId]/actions.ts", name: "issueStatementAction", guard: { by: "user", checkedIn: "issueStatement" }, form: {}, expect: ADMIN_ONLY_WRITE },
  { file: "app/(office)/dispatch/actions.ts", name: "dispatchLotAction", guard: { by: "user", checkedIn: "requireAny" }, form: {}, expect: o("401", "422", "422", "422", "422", "403", "403") },
  { file: "app/(office)/dispatch/actions.ts", name: "confirmReceiptAction", guard: { by: "user", checkedIn: "requireAny" }, form: {}, expect: o("401", "422", "422", "422", "422", "403", "403") },
  { file: "app/(office)/dispatch/actions.ts", name: "declineReceiptAction", guard: { by: "user", checkedIn: "requireAny" }, form: {}, expect: o("401", "422", "422", "422", "422", "403", "403") },
  { file: "app/(office)/receive/actions.ts", name: "receiveLotAction", guard: { by: "user", checkedIn: "recordEvent" }, form: {}, expect: o("401", "422", "422", "403", "422", "403", "403") },
];

// ───────────────────────────── known deviations ─────────────────────────────

/**
 * Cells where the app answers otherwise than the table expects: bugs reported, not fixed here.
 * The test asserts each still answers `actual`, so a fix makes it fail until its line is removed.
 */
export type Deviation = { key: string; who: Who[]; actual: Outcome; issue: string };

const PARSE_BEFORE_PERMISSION = "the body is parsed before the role is checked, so a role without the permission learns the schema (422) instead of 403 — DEVELOPERS.md: permission, then parse";

export const DEVIATIONS: Deviation[] = [];
