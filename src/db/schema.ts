import { sql } from "drizzle-orm";
import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { PARTY_KINDS, ROLES } from "../domain/roles";

const createdAt = () =>
  integer("created_at", { mode: "timestamp_ms" })
    .notNull()
    .default(sql`(unixepoch('subsec') * 1000)`);

export const parties = sqliteTable("parties", {
  id: text("id").primaryKey(),
  kind: text("kind", { enum: PARTY_KINDS }).notNull(),
  name: text("name").notNull(),
  address: text("address").notNull().default(""),
  region: text("region").notNull().default(""),
  email: text("email").notNull().default(""),
  phone: text("phone").notNull().default(""),
  // Growers and mills choose whether the brewery may name them on public provenance pages.
  namedPublicly: integer("named_publicly", { mode: "boolean" }).notNull().default(false),
  // A supplier's qualified-invoice registration number ("T" and 13 digits), where they have one.
  invoiceNumber: text("invoice_number"),
  createdAt: createdAt(),
});

export const users = sqliteTable(
  "users",
  {
    id: text("id").primaryKey(),
    partyId: text("party_id")
      .notNull()
      .references(() => parties.id),
    email: text("email").notNull(),
    name: text("name").notNull(),
    role: text("role", { enum: ROLES }).notNull(),
    // Null until the invited person sets a password through their link.
    passwordHash: text("password_hash"),
    disabledAt: integer("disabled_at", { mode: "timestamp_ms" }),
    // The person's own language choice (a setting, not a record); null follows the browser.
    locale: text("locale", { enum: ["ja", "en"] }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("users_email_unique").on(t.email)],
);

export const sessions = sqliteTable("sessions", {
  // SHA-256 (hex) of the token in the cookie; the token itself is never stored (src/server/accounts/session-token.ts).
  id: text("id").primaryKey(),
  userId: text("user_id")
    .notNull()
    .references(() => users.id),
  // Unix seconds: the lucia Drizzle adapter stores it this way.
  expiresAt: integer("expires_at").notNull(),
  // Unix seconds; a session ends a fixed time after this however active it is (src/server/accounts/auth.ts).
  signedInAt: integer("signed_in_at").notNull(),
});

export const passwordTokens = sqliteTable(
  "password_tokens",
  {
    id: text("id").primaryKey(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id),
    // SHA-256 of the token sent by e-mail; the token itself is never stored.
    tokenHash: text("token_hash").notNull(),
    purpose: text("purpose", { enum: ["invite", "reset"] }).notNull(),
    expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
    usedAt: integer("used_at", { mode: "timestamp_ms" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("password_tokens_hash_unique").on(t.tokenHash)],
);

export const signInThrottle = sqliteTable("sign_in_throttle", {
  key: text("key").primaryKey(),
  failures: integer("failures").notNull(),
  windowStartedAt: integer("window_started_at", { mode: "timestamp_ms" }).notNull(),
  // No attempt is taken on this key before this time (src/server/accounts/throttle.ts).
  blockedUntil: integer("blocked_until", { mode: "timestamp_ms" }),
});

export const outbox = sqliteTable(
  "outbox",
  {
    id: text("id").primaryKey(),
    toAddress: text("to_address").notNull(),
    fromAddress: text("from_address").notNull(),
    subject: text("subject").notNull(),
    textBody: text("text_body").notNull(),
    htmlBody: text("html_body"),
    transport: text("transport", { enum: ["local", "smtp"] }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("outbox_created_idx").on(t.createdAt)],
);

export const auditLog = sqliteTable(
  "audit_log",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    at: createdAt(),
    userId: text("user_id"),
    action: text("action").notNull(),
    subject: text("subject").notNull(),
    detail: text("detail").notNull().default("{}"),
  },
  (t) => [index("audit_log_at_idx").on(t.at)],
);

export const fields = sqliteTable(
  "fields",
  {
    id: text("id").primaryKey(),
    growerId: text("grower_id")
      .notNull()
      .references(() => parties.id),
    name: text("name").notNull(),
    region: text("region").notNull(),
    areaHa: real("area_ha").notNull(),
    latitude: real("latitude"),
    longitude: real("longitude"),
    createdAt: createdAt(),
  },
  (t) => [index("fields_grower_idx").on(t.growerId)],
);

// ---------------------------------------------------------------------------
// The lot ledger. Lots are the physical things; events are appended and never
// changed (triggers in the migration refuse UPDATE and DELETE on them).

export const LOT_KINDS = ["harvest", "polished", "bran", "soaked", "steamed", "koji", "starter", "tank", "sake", "lees", "blend", "bottled"] as const;
export const LOT_UNITS = ["kg", "L", "bottle"] as const;

export const lots = sqliteTable(
  "lots",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    code: text("code").notNull(),
    kind: text("kind", { enum: LOT_KINDS }).notNull(),
    unit: text("unit", { enum: LOT_UNITS }).notNull(),
    partyId: text("party_id").notNull().references(() => parties.id),
    // The party whose event made the lot (the grower of a harvest, the mill of a polished lot).
    originPartyId: text("origin_party_id").notNull().references(() => parties.id),
    fieldId: text("field_id").references(() => fields.id),
    variety: text("variety"),
    cropYear: integer("crop_year"),
    grade: text("grade"),
    moisturePct: real("moisture_pct"),
    polishingRatioPct: real("polishing_ratio_pct"),
    attributes: text("attributes").notNull().default("{}"),
    // Running totals kept in the same transaction as each event, so reads need no replay.
    quantityIn: real("quantity_in").notNull().default(0),
    onHand: real("on_hand").notNull().default(0),
    // Rice (dry polished basis) or litres carried into the lot: the denominator of its composition.
    contentIn: real("content_in").notNull().default(0),
    // The party a dispatch sent the lot to, until its receipt (or the dispatch's correction):
    // kept with the holder, in the same transaction as those events, so reads need no replay.
    inTransitTo: text("in_transit_to").references(() => parties.id),
    createdAt: integer("created_at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [uniqueIndex("lots_code_unique").on(t.code), index("lots_kind_idx").on(t.kind, t.createdAt), index("lots_party_idx").on(t.partyId)],
);

/** Steps of ../shared/api.md plus "registering", the commissioning of a harvest lot. */
export const EVENT_STEPS = [
  "registering", "receiving", "shipping", "polishing", "soaking", "steaming", "splitting", "koji-making",
  "starter", "mash-addition", "pressing", "blending", "bottling", "measuring", "correcting",
] as const;

export const events = sqliteTable(
  "events",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    step: text("step", { enum: EVENT_STEPS }).notNull(),
    // When it happened on the floor, and when Grainline heard of it.
    at: integer("at", { mode: "timestamp_ms" }).notNull(),
    recordedAt: integer("recorded_at", { mode: "timestamp_ms" }).notNull(),
    userId: text("user_id").notNull().references(() => users.id),
    partyId: text("party_id").notNull().references(() => parties.id),
    counterpartyId: text("counterparty_id").references(() => parties.id),
    place: text("place").notNull().default(""),
    referenceDoc: text("reference_doc").notNull().default(""),
    note: text("note").notNull().default(""),
    corrects: integer("corrects"),
    reason: text("reason").notNull().default(""),
    attributes: text("attributes").notNull().default("{}"),
  },
  // By party and step: a supplier's account lists one party's runs or receipts, which a walk of
  // every event by date (events_at_idx) reads 67,000 rows to find on the 10-season ledger.
  (t) => [index("events_at_idx").on(t.at), uniqueIndex("events_corrects_unique").on(t.corrects), index("events_party_step_idx").on(t.partyId, t.step, t.at)],
);

export const eventInputs = sqliteTable(
  "event_inputs",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    eventId: integer("event_id").notNull().references(() => events.id),
    lotId: integer("lot_id").notNull().references(() => lots.id),
    // Drawn from on-hand (0 for a measurement or a receipt, which move nothing).
    quantity: real("quantity").notNull(),
    // The rice (or litres) this draw carried: its weight in the mix of the event's outputs.
    content: real("content").notNull(),
    // "draw" takes from on-hand; "move" hands the whole lot to another party (a receipt);
    // "dispatch" sends it on its way (the slip weight; custody moves at the receipt); "loss" is
    // the shortfall a receipt finds (slip − arrival); "observe" touches nothing (measurements).
    use: text("use", { enum: ["draw", "move", "dispatch", "loss", "observe"] }).notNull(),
    // The holder before a move, kept so that a correction can hand the lot back.
    previousPartyId: text("previous_party_id"),
  },
  (t) => [index("event_inputs_event_idx").on(t.eventId), index("event_inputs_lot_idx").on(t.lotId)],
);

export const eventOutputs = sqliteTable(
  "event_outputs",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    eventId: integer("event_id").notNull().references(() => events.id),
    lotId: integer("lot_id").notNull().references(() => lots.id),
    quantity: real("quantity").notNull(),
    content: real("content").notNull(),
  },
  (t) => [index("event_outputs_event_idx").on(t.eventId), index("event_outputs_lot_idx").on(t.lotId)],
);

/**
 * Lineage edges: how much of a child lot's content an event brought from a parent lot.
 * A child's share from a parent is the sum of its edges over its content_in; a reversal
 * adds the same edge with a negative weight.
 */
export const lineageEdges = sqliteTable(
  "lineage_edges",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    eventId: integer("event_id").notNull().references(() => events.id),
    parentLotId: integer("parent_lot_id").notNull().references(() => lots.id),
    childLotId: integer("child_lot_id").notNull().references(() => lots.id),
    weight: real("weight").notNull(),
  },
  (t) => [index("lineage_child_idx").on(t.childLotId, t.parentLotId, t.weight), index("lineage_parent_idx").on(t.parentLotId, t.childLotId, t.weight)],
);

export const measurements = sqliteTable(
  "measurements",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    eventId: integer("event_id").notNull().references(() => events.id),
    lotId: integer("lot_id").references(() => lots.id),
    name: text("name").notNull(),
    value: real("value").notNull(),
    unit: text("unit").notNull(),
  },
  (t) => [index("measurements_event_idx").on(t.eventId), index("measurements_lot_idx").on(t.lotId)],
);

/** The first answer to a write, replayed when the same Idempotency-Key comes again. */
export const idempotencyKeys = sqliteTable("idempotency_keys", {
  key: text("key").primaryKey(),
  userId: text("user_id").notNull(),
  requestHash: text("request_hash").notNull(),
  status: integer("status").notNull(),
  response: text("response").notNull(),
  createdAt: integer("created_at", { mode: "timestamp_ms" }).notNull(),
});

export const lotCodeCounters = sqliteTable("lot_code_counters", {
  prefix: text("prefix").primaryKey(),
  last: integer("last").notNull(),
});

export const attachments = sqliteTable(
  "attachments",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    lotId: integer("lot_id").references(() => lots.id),
    eventId: integer("event_id").references(() => events.id),
    sha256: text("sha256").notNull(),
    fileName: text("file_name").notNull(),
    contentType: text("content_type").notNull(),
    size: integer("size").notNull(),
    title: text("title").notNull().default(""),
    userId: text("user_id").notNull().references(() => users.id),
    createdAt: integer("created_at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [index("attachments_lot_idx").on(t.lotId), index("attachments_event_idx").on(t.eventId)],
);

/** Brewery settings the office may change (bands, margins); defaults live in the code. */
export const settings = sqliteTable("settings", {
  key: text("key").primaryKey(),
  value: text("value").notNull(),
  updatedAt: integer("updated_at", { mode: "timestamp_ms" }).notNull(),
  updatedBy: text("updated_by").notNull(),
});

/**
 * The brewery's products: what a bottling fills (brand name, the category its label claims,
 * bottle size) and the GTIN its barcode carries — one GTIN per product and size (GS1 General
 * Specifications, GTIN allocation). Kept as registered; a bottling copies what it used.
 */
export const products = sqliteTable(
  "products",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    name: text("name").notNull(),
    // A category of CATEGORY_RULES (src/domain/categories.ts), or "" when the label claims none.
    category: text("category").notNull().default(""),
    bottleMl: integer("bottle_ml").notNull(),
    // Kept as the 14-digit form (a JAN-13 with a leading 0), so one product has one spelling.
    gtin: text("gtin").notNull(),
    userId: text("user_id").notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("products_gtin_unique").on(t.gtin)],
);

/**
 * Composition kept as it is made: how much of a lot's content each harvest lot accounts
 * for, one row per event, lot and source. A lot's shares are the sums over its content_in;
 * a correction appends the negated rows. Backward trace and forward trace from a harvest
 * lot are then a single indexed query, with no walk through history.
 */
export const lotSourceDeltas = sqliteTable(
  "lot_source_deltas",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    eventId: integer("event_id").notNull().references(() => events.id),
    lotId: integer("lot_id").notNull().references(() => lots.id),
    sourceLotId: integer("source_lot_id").notNull().references(() => lots.id),
    amount: real("amount").notNull(),
  },
  (t) => [index("lot_source_by_lot").on(t.lotId, t.sourceLotId, t.amount), index("lot_source_by_source").on(t.sourceLotId, t.lotId, t.amount)],
);

/**
 * A receipt no dispatch matched: what the receiver wrote down, kept as typed (the code may
 * name no lot, or one the receiver may not see), awaiting the sender's word. Appended only.
 */
export const receiptRequests = sqliteTable(
  "receipt_requests",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    receiverPartyId: text("receiver_party_id").notNull().references(() => parties.id),
    code: text("code").notNull(),
    // The weight on arrival, in the unit of the lot it turns out to be.
    quantity: real("quantity").notNull(),
    // The sender the receiver named, if any (unchecked until the sender confirms).
    senderPartyId: text("sender_party_id").references(() => parties.id),
    referenceDoc: text("reference_doc").notNull().default(""),
    place: text("place").notNull().default(""),
    note: text("note").notNull().default(""),
    // Readings taken at arrival (e.g. moisture), as the API's `measurements` (JSON), recorded on confirmation.
    measurements: text("measurements").notNull().default("[]"),
    at: integer("at", { mode: "timestamp_ms" }).notNull(),
    userId: text("user_id").notNull().references(() => users.id),
    recordedAt: integer("recorded_at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [index("receipt_requests_code_idx").on(t.code), index("receipt_requests_receiver_idx").on(t.receiverPartyId)],
);

/** The sender's (or the office's) answer to a receipt request: confirmed with its receipt event, or declined with a reason. */
export const receiptOutcomes = sqliteTable(
  "receipt_outcomes",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    requestId: integer("request_id").notNull().references(() => receiptRequests.id),
    outcome: text("outcome", { enum: ["confirmed", "declined"] }).notNull(),
    eventId: integer("event_id").references(() => events.id),
    reason: text("reason").notNull().default(""),
    userId: text("user_id").notNull().references(() => users.id),
    recordedAt: integer("recorded_at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [uniqueIndex("receipt_outcomes_request_unique").on(t.requestId)],
);

/**
 * Holds put on lots (from a recall) and their releases, appended only (triggers in the
 * migration): a lot is on hold while its newest row is a hold. `recallCode` names the recall
 * the action was taken from, when it was.
 */
export const lotHolds = sqliteTable(
  "lot_holds",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    lotId: integer("lot_id").notNull().references(() => lots.id),
    action: text("action", { enum: ["hold", "release"] }).notNull(),
    reason: text("reason").notNull(),
    recallCode: text("recall_code").notNull().default(""),
    userId: text("user_id").notNull().references(() => users.id),
    at: integer("at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [index("lot_holds_lot_idx").on(t.lotId, t.id)],
);

// ---------------------------------------------------------------------------
// The supplier ledger: what the brewery owes growers and mills, in integer yen. Contracts,
// entries and statements are appended, never changed (triggers in the migration).

export const SUPPLIER_CONTRACT_KINDS = ["grower", "mill"] as const;

/**
 * Contract terms by version: a new version supersedes the one before for the same scope
 * (a grower's variety and crop year, or a mill's polishing); the old one stays on record.
 */
export const supplierContracts = sqliteTable(
  "supplier_contracts",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    partyId: text("party_id").notNull().references(() => parties.id),
    kind: text("kind", { enum: SUPPLIER_CONTRACT_KINDS }).notNull(),
    // "variety|cropYear" for a grower, "polishing" for a mill.
    scope: text("scope").notNull(),
    variety: text("variety"),
    cropYear: integer("crop_year"),
    version: integer("version").notNull(),
    // Prices per 60 kg bag by grade and the moisture rule, or the mill's fee tiers (JSON).
    terms: text("terms").notNull(),
    note: text("note").notNull().default(""),
    userId: text("user_id").notNull().references(() => users.id),
    createdAt: integer("created_at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [uniqueIndex("supplier_contracts_version_unique").on(t.partyId, t.scope, t.version)],
);

export const SUPPLIER_ENTRY_KINDS = ["delivery", "polishing-fee", "reversal", "payment", "adjustment"] as const;

/**
 * One line of a supplier's account. Positive amounts are owed to the supplier, negative
 * ones reduce it (payments). Taxable lines carry their rate; tax itself is computed per
 * statement per rate, never per line.
 */
export const supplierEntries = sqliteTable(
  "supplier_entries",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    partyId: text("party_id").notNull().references(() => parties.id),
    kind: text("kind", { enum: SUPPLIER_ENTRY_KINDS }).notNull(),
    at: integer("at", { mode: "timestamp_ms" }).notNull(),
    amountYen: integer("amount_yen").notNull(),
    // 8 (reduced, rice), 10 (standard, services) or 0 (outside the tax computation).
    taxRatePct: integer("tax_rate_pct").notNull(),
    eventId: integer("event_id").references(() => events.id),
    reversesEntryId: integer("reverses_entry_id"),
    contractId: integer("contract_id").references(() => supplierContracts.id),
    lotId: integer("lot_id").references(() => lots.id),
    // How the amount was worked out (kg, bags, grade, price, moisture steps, tier …), JSON.
    detail: text("detail").notNull().default("{}"),
    method: text("method").notNull().default(""),
    reference: text("reference").notNull().default(""),
    reason: text("reason").notNull().default(""),
    userId: text("user_id").notNull().references(() => users.id),
    recordedAt: integer("recorded_at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [
    index("supplier_entries_party_idx").on(t.partyId, t.at),
    index("supplier_entries_event_idx").on(t.eventId),
    uniqueIndex("supplier_entries_reverses_unique").on(t.reversesEntryId),
  ],
);

/** A statement as issued: its period, the rounding it used and its totals, frozen. */
export const supplierStatements = sqliteTable(
  "supplier_statements",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    number: text("number").notNull(),
    partyId: text("party_id").notNull().references(() => parties.id),
    fromDay: text("from_day").notNull(),
    toDay: text("to_day").notNull(),
    rounding: text("rounding").notNull(),
    // Per-rate net and tax, payments and adjustments of the period (JSON).
    totals: text("totals").notNull(),
    balanceYen: integer("balance_yen").notNull(),
    userId: text("user_id").notNull().references(() => users.id),
    issuedAt: integer("issued_at", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [uniqueIndex("supplier_statements_number_unique").on(t.number), index("supplier_statements_party_idx").on(t.partyId)],
);

/** Which entries a statement covers: each entry is stated once. */
export const supplierStatementEntries = sqliteTable(
  "supplier_statement_entries",
  {
    statementId: integer("statement_id").notNull().references(() => supplierStatements.id),
    entryId: integer("entry_id").notNull().references(() => supplierEntries.id),
  },
  (t) => [uniqueIndex("supplier_statement_entries_entry_unique").on(t.entryId), index("supplier_statement_entries_statement_idx").on(t.statementId)],
);
