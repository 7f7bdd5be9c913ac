import "server-only";
import { asc, eq, like, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { products } from "@/db/schema";
import { can } from "@/domain/permissions";
import { productSchema } from "@/lib/validation/products";
import type { Translate } from "@/lib/validation/field-errors";
import { recordAudit } from "../records/audit";
import { getDb } from "../platform/db";
import { forbidden, invalid } from "../platform/errors";
import type { SessionUser } from "../accounts/session";

export type Product = { id: number; name: string; category: string; bottleMl: number; gtin: string };
const columns = { id: products.id, name: products.name, category: products.category, bottleMl: products.bottleMl, gtin: products.gtin };

/** The register, by name: brewery master data, the same for every reader who may bottle or search. */
export function listProducts(db: DbOrTx = getDb()): Product[] {
  return db.select(columns).from(products).orderBy(asc(products.name), asc(products.id)).all();
}

export function findProduct(db: DbOrTx, id: number): Product | null {
  return Number.isSafeInteger(id) ? (db.select(columns).from(products).where(eq(products.id, id)).get() ?? null) : null;
}

/** Products whose brand name holds `text` (case-insensitive for ASCII, as SQLite's LIKE). */
export function productsNamed(text: string): Product[] {
  const pattern = `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  return getDb().select(columns).from(products).where(sql`${like(products.name, pattern)} escape '\\'`).orderBy(asc(products.name)).limit(20).all();
}

export function productByGtin(gtin14: string): Product | null {
  return getDb().select(columns).from(products).where(eq(products.gtin, gtin14)).get() ?? null;
}

/** The office registers a product; a GTIN names one product only. Audited with what was registered. */
export function createProduct(actor: SessionUser, raw: unknown, t: Translate): { id: number } {
  if (!can(actor, "settings:manage")) throw forbidden();
  const input = productSchema.parse(raw);
  return getDb().transaction((tx) => {
    if (tx.select({ id: products.id }).from(products).where(eq(products.gtin, input.gtin)).get()) throw invalid({ gtin: [t("validation.gtinTaken")] });
    const row = tx.insert(products).values({ ...input, userId: actor.id }).returning({ id: products.id }).get();
    recordAudit(tx, { userId: actor.id, action: "product.created", subject: `product:${row.id}`, detail: { ...input } });
    return { id: row.id };
  });
}

/**
 * The product a bottled lot was filled as, with the category its label claims held against
 * the lot's claims as they stand now (a correction upstream can change them); null for any
 * other lot or a bottling that named no product.
 */
export function productOfLot(lotId: number, eligible: string[] | null) {
  const row = getDb().get<{ name: string | null; category: string | null; bottleMl: number | null }>(sql`
    select json_extract(attributes, '$.productName') as name, json_extract(attributes, '$.category') as category, json_extract(attributes, '$.bottleMl') as bottleMl
    from lots where id = ${lotId} and kind = 'bottled'`);
  if (!row?.name) return null;
  const category = row.category ?? "";
  return { name: row.name, category, bottleMl: row.bottleMl, claimSupported: category === "" || (eligible ?? []).includes(category) };
}
