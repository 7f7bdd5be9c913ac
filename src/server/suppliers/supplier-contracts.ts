import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { parties, supplierContracts, users } from "@/db/schema";
import { can } from "@/domain/permissions";
import { GRADES } from "@/domain/grades";
import type { GrowerTerms, MillTerms } from "@/domain/supplier-prices";
import type { Translate } from "@/lib/validation/field-errors";
import { growerContractSchema, millContractSchema, parseSupplierInput } from "@/lib/validation/suppliers";
import { getDb } from "../platform/db";
import { forbidden, invalid, notFound } from "../platform/errors";
import type { SessionUser } from "../accounts/session";

type ContractRow = typeof supplierContracts.$inferSelect;
export type GrowerContract = Omit<ContractRow, "terms"> & { terms: GrowerTerms };
export type MillContract = Omit<ContractRow, "terms"> & { terms: MillTerms };

const growerScope = (variety: string, cropYear: number) => `${variety.trim().toLowerCase()}|${cropYear}`;
const MILL_SCOPE = "polishing";

function supplier(tx: DbOrTx, partyId: string, kind: "grower" | "mill", t: Translate) {
  const party = tx.select({ id: parties.id, kind: parties.kind }).from(parties).where(eq(parties.id, partyId)).get();
  if (!party || (party.kind !== "grower" && party.kind !== "mill")) throw notFound("errors.supplierNotFound");
  if (party.kind !== kind) throw invalid({ _: [t("suppliers.validation.wrongKind")] });
  return party;
}

/** Appends the next version for the scope; the previous one stays, superseded. */
function appendVersion(tx: DbOrTx, actor: SessionUser, row: Omit<typeof supplierContracts.$inferInsert, "version" | "userId" | "createdAt">) {
  const last = tx
    .select({ v: sql<number>`max(${supplierContracts.version})` })
    .from(supplierContracts)
    .where(and(eq(supplierContracts.partyId, row.partyId), eq(supplierContracts.scope, row.scope)))
    .get()?.v;
  const version = (last ?? 0) + 1;
  const id = tx.insert(supplierContracts).values({ ...row, version, userId: actor.id, createdAt: new Date() }).returning({ id: supplierContracts.id }).get().id;
  return { id, version };
}

export function addGrowerContract(actor: SessionUser, partyId: string, raw: unknown, t: Translate, db: DbOrTx = getDb()) {
  if (!can(actor, "ledger:manage")) throw forbidden();
  const input = parseSupplierInput(growerContractSchema, raw, t, (f) => invalid(f));
  const prices = Object.fromEntries(GRADES.flatMap((g) => (input.prices[g] === undefined ? [] : [[g, input.prices[g]]])));
  const terms: GrowerTerms = { pricesPerBagYen: prices, moisture: { thresholdPct: input.moistureThresholdPct, stepPct: input.moistureStepPct, deductionYenPerBagPerStep: input.moistureDeductionYen } };
  return db.transaction((tx) => {
    supplier(tx, partyId, "grower", t);
    return appendVersion(tx, actor, { partyId, kind: "grower", scope: growerScope(input.variety, input.cropYear), variety: input.variety, cropYear: input.cropYear, terms: JSON.stringify(terms), note: input.note });
  });
}

export function addMillContract(actor: SessionUser, partyId: string, raw: unknown, t: Translate, db: DbOrTx = getDb()) {
  if (!can(actor, "ledger:manage")) throw forbidden();
  const input = parseSupplierInput(millContractSchema, raw, t, (f) => invalid(f));
  const terms: MillTerms = { tiers: input.tiers };
  return db.transaction((tx) => {
    supplier(tx, partyId, "mill", t);
    return appendVersion(tx, actor, { partyId, kind: "mill", scope: MILL_SCOPE, terms: JSON.stringify(terms), note: input.note });
  });
}

/** The version in force: the latest for the scope. */
export function currentGrowerContract(tx: DbOrTx, partyId: string, variety: string | null, cropYear: number | null): GrowerContract | null {
  if (!variety || cropYear == null) return null;
  return latest(tx, partyId, growerScope(variety, cropYear)) as GrowerContract | null;
}

export function currentMillContract(tx: DbOrTx, partyId: string): MillContract | null {
  return latest(tx, partyId, MILL_SCOPE) as MillContract | null;
}

function latest(tx: DbOrTx, partyId: string, scope: string) {
  const row = tx.select().from(supplierContracts).where(and(eq(supplierContracts.partyId, partyId), eq(supplierContracts.scope, scope))).orderBy(desc(supplierContracts.version)).get();
  return row ? { ...row, terms: JSON.parse(row.terms) } : null;
}

/** Every version, newest first, each marked whether a later one superseded it. */
export function listContracts(partyId: string) {
  const rows = getDb()
    .select({ contract: supplierContracts, by: users.name })
    .from(supplierContracts)
    .innerJoin(users, eq(users.id, supplierContracts.userId))
    .where(eq(supplierContracts.partyId, partyId))
    .orderBy(supplierContracts.scope, desc(supplierContracts.version))
    .all();
  const seen = new Set<string>();
  return rows.map(({ contract, by }) => {
    const superseded = seen.has(contract.scope);
    seen.add(contract.scope);
    return { id: contract.id, kind: contract.kind, variety: contract.variety, cropYear: contract.cropYear, version: contract.version, terms: JSON.parse(contract.terms) as GrowerTerms | MillTerms, note: contract.note, by, createdAt: contract.createdAt, superseded };
  });
}
