import "server-only";
import { and, asc, desc, eq, or, sql, type AnyColumn, type SQL } from "drizzle-orm";
import { fields, lots, parties } from "@/db/schema";
import { can } from "@/domain/permissions";
import { readSearchTerms } from "@/domain/search-terms";
import { getDb } from "../platform/db";
import { visibleTo } from "../ledger/lots";
import { productByGtin, productsNamed, type Product } from "../ledger/products";
import type { SessionUser } from "../accounts/session";
import { readTankRegister } from "../floor/tank-register";

const LIMIT = 20;
const lotHit = { code: lots.code, kind: lots.kind, onHand: lots.onHand, unit: lots.unit, attributes: lots.attributes };
type LotHit = { code: string; kind: string; onHand: number; unit: string; attributes: string };
const escaped = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
const contains = (column: SQL | AnyColumn, text: string) => sql`${column} like ${escaped(text)} escape '\\'`;

/**
 * One search box over what the reader may see, and nothing else: lots by the visibility rule
 * (visibleTo), products to the brewery's readers, growers and fields as the field pages show
 * them. A lot nobody may see and a lot that does not exist both give no hit.
 */
export function searchEverything(actor: SessionUser, query: string) {
  const terms = readSearchTerms(query);
  const empty = { query: terms.text, lots: [], bottlings: [], products: [], tanks: [], tankRegister: [], growers: [], fields: [] };
  if (terms.text.length < 2) return empty;
  const seen = visibleTo(actor);
  const findLots = (where: SQL | undefined) => getDb().select(lotHit).from(lots).where(and(seen, where)).orderBy(desc(lots.id)).limit(LIMIT).all() as LotHit[];
  const brand = (l: LotHit) => (JSON.parse(l.attributes) as { productName?: string }).productName ?? null;
  const short = (l: LotHit) => ({ code: l.code, kind: l.kind, onHand: l.onHand, unit: l.unit, product: brand(l) });

  const byCode = terms.compactCode ? findLots(sql`replace(${lots.code}, '-', '') like ${escaped(terms.compactCode)} escape '\\'`) : [];
  const readsProducts = can(actor, "records:read-all");
  const products: Product[] = readsProducts ? [...(terms.gtin14 ? [productByGtin(terms.gtin14)].filter((p): p is Product => p !== null) : []), ...productsNamed(terms.text)] : [];
  const productIds = [...new Set(products.map((p) => p.id))];
  // A bottling carries its GTIN as recorded; a JAN-13 and its GTIN-14 are compared padded to 14 digits.
  const bottled = and(
    eq(lots.kind, "bottled"),
    or(
      terms.gtin14 ? sql`substr('00000000000000' || json_extract(${lots.attributes}, '$.gtin'), -14) = ${terms.gtin14}` : undefined,
      productIds.length ? sql`json_extract(${lots.attributes}, '$.productId') in (${sql.join(productIds.map((id) => sql`${id}`), sql`, `)})` : undefined,
    ),
  );
  const bottlings = terms.gtin14 || productIds.length ? findLots(bottled) : [];
  // Tanks by name: the register's (brewery readers), and tank lots named so or filled in a tank so named.
  const register = readsProducts ? readTankRegister().filter((x) => x.name.toLowerCase().includes(terms.text.toLowerCase())) : [];
  const registerIds = register.map((x) => x.id);
  const tanks = findLots(
    and(
      eq(lots.kind, "tank"),
      or(
        contains(sql`json_extract(${lots.attributes}, '$.tankName')`, terms.text),
        registerIds.length ? sql`json_extract(${lots.attributes}, '$.tankId') in (${sql.join(registerIds.map((id) => sql`${id}`), sql`, `)})` : undefined,
      ),
    ),
  );
  const tankName = (l: LotHit) => {
    const a = JSON.parse(l.attributes) as { tankName?: string; tankId?: string };
    return register.find((x) => x.id === a.tankId)?.name ?? a.tankName ?? l.code;
  };
  return {
    query: terms.text,
    lots: byCode.map(short),
    bottlings: bottlings.map(short),
    products: [...new Map(products.map((p) => [p.id, p])).values()],
    tanks: tanks.map((l) => ({ ...short(l), name: tankName(l) })),
    tankRegister: register.map((x) => ({ id: x.id, name: x.name, capacityL: x.capacityL, location: x.location, active: x.active })),
    ...growersAndFields(actor, terms.text),
  };
}
export type SearchResults = ReturnType<typeof searchEverything>;

/** Growers see their own party and paddies; roles that read all fields see every grower's (listFields). */
function growersAndFields(actor: SessionUser, text: string) {
  const all = can(actor, "fields:read-all");
  const own = can(actor, "fields:write-own") ? actor.partyId : null;
  if (!all && !own) return { growers: [], fields: [] };
  const db = getDb();
  const growers = db
    .select({ id: parties.id, name: parties.name, region: parties.region })
    .from(parties)
    .where(and(eq(parties.kind, "grower"), contains(parties.name, text), all ? undefined : eq(parties.id, own!)))
    .orderBy(asc(parties.name))
    .limit(LIMIT)
    .all();
  const found = db
    .select({ id: fields.id, name: fields.name, region: fields.region, growerName: parties.name })
    .from(fields)
    .innerJoin(parties, eq(parties.id, fields.growerId))
    .where(and(or(contains(fields.name, text), contains(fields.region, text)), all ? undefined : eq(fields.growerId, own!)))
    .orderBy(asc(fields.name))
    .limit(LIMIT)
    .all();
  return { growers, fields: found };
}
