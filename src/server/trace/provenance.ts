import "server-only";
import { sql } from "drizzle-orm";
import { originsByWeight, originStatement, sharesBy } from "@/domain/origin";
import { ancestryOf, lotsOfKindUp, type Ancestry } from "./ancestry";
import { claimedCategories, type ClaimedCategories } from "./claims";
import { keyDates } from "./key-dates";
import { warmInBackground } from "./warm-up";
import { getDb } from "../platform/db";
import { notFound } from "../platform/errors";
import { productOfLot } from "../ledger/products";
import { sourcesOf, traceHead } from "./trace";
import type { SessionUser } from "../accounts/session";

const CLAIMABLE = ["tank", "sake", "blend", "bottled"];

type Head = { id: number; code: string; kind: string; contentIn: number };

function namedGrowers(lotId: number, contentIn: number) {
  const sources = sourcesOf(lotId, contentIn);
  const consent = new Map(
    getDb()
      .all<{ id: string; named: number }>(sql`select id, named_publicly as named from parties where kind = 'grower'`)
      .map((p) => [p.id, p.named === 1]),
  );
  // Growers who have not agreed to be named are counted, never named.
  const growers = sharesBy(sources, (s) => (consent.get(s.grower.id) ? s.grower.name : ""), (s) => s.share);
  return { sources, growers: growers.map((g) => ({ name: g.name || null, share: g.share })) };
}

/** The provenance answer for any lot: what sales tell a buyer, built from the lineage. */
export function provenanceOf(head: Head, claims: ClaimedCategories | null, ancestry: Ancestry = ancestryOf(head.id)) {
  const { sources, growers } = namedGrowers(head.id, head.contentIn);
  const ratios = [...new Set(lotsOfKindUp(ancestry, head.id, "polished").map((p) => p.polishingRatioPct).filter((r): r is number => r !== null))];
  return {
    lot: { code: head.code, kind: head.kind },
    varieties: sharesBy(sources, (s) => s.variety ?? "unknown", (s) => s.share),
    cropYears: [...new Set(sources.map((s) => s.cropYear).filter((y): y is number => y !== null))].sort(),
    origins: originsByWeight(sources.map((s) => ({ region: s.field?.region ?? null, share: s.share }))),
    originStatement: originStatement(sources.map((s) => ({ region: s.field?.region ?? null, share: s.share }))),
    growers,
    polishingRatiosPct: ratios.sort((a, b) => a - b),
    kojiRatioPct: claims?.kojiRatioPct ?? null,
    categories: claims?.eligible ?? [],
    product: productOfLot(head.id, claims?.eligible ?? null),
    ...keyDates(head.id, ancestry),
    shares: sources.length,
  };
}
export type Provenance = ReturnType<typeof provenanceOf>;

export function provenanceFor(actor: SessionUser, code: string): Provenance {
  const head = traceHead(actor, code);
  warmInBackground();
  // The claims and the card read the same lineage: it is walked once.
  const ancestry = ancestryOf(head.id);
  return provenanceOf(head, CLAIMABLE.includes(head.kind) ? claimedCategories(head.id, ancestry) : null, ancestry);
}

/**
 * The public page of a bottling, reached from the bottle's GS1 Digital Link QR. Only a
 * bottled lot whose GTIN matches answers; anything else is "not found".
 */
export function findBottling(gtin14: string, lotCode: string) {
  const row = getDb().get<{ id: number; code: string; kind: string; contentIn: number; gtin: string; bottleMl: number; quantity: number }>(sql`
    select id, code, kind, content_in as contentIn, json_extract(attributes, '$.gtin') as gtin, json_extract(attributes, '$.bottleMl') as bottleMl, quantity_in as quantity
    from lots where code = ${lotCode} and kind = 'bottled'`);
  if (!row || String(row.gtin).padStart(14, "0") !== gtin14) throw notFound("errors.bottlingNotFound");
  return row;
}

export function publicProvenance(gtin14: string, lotCode: string) {
  const bottling = findBottling(gtin14, lotCode);
  warmInBackground();
  const ancestry = ancestryOf(bottling.id);
  return { bottling, provenance: provenanceOf(bottling, claimedCategories(bottling.id, ancestry), ancestry) };
}
