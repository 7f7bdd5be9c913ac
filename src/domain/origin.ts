import { findPrefecture } from "./prefectures";

/**
 * Rice-origin wording under Japan's rice traceability act (MAFF, 米トレーサビリティ法; see
 * ../shared/references.md): Japanese rice is named by prefecture (or simply "domestic"),
 * imported rice by country, and several origins are listed in descending order of weight.
 */
export type OriginShare = { region: string | null; share: number };

export function originsByWeight(sources: OriginShare[]): { origin: string; share: number }[] {
  const totals = new Map<string, number>();
  for (const s of sources) {
    const origin = s.region?.trim() || "domestic";
    totals.set(origin, (totals.get(origin) ?? 0) + s.share);
  }
  return [...totals]
    .filter(([, share]) => share > 1e-9)
    .sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))
    .map(([origin, share]) => ({ origin, share }));
}

/** "Rice origin: Hyogo, Okayama" — the order carries the meaning, so shares are not needed on a label. */
export function originStatement(sources: OriginShare[]): string {
  return originsByWeight(sources).map((o) => o.origin).join(", ");
}

/**
 * An origin in Japanese: 国産 ("domestic") where no prefecture is known, the prefecture's name
 * with 産 (新潟県産), or the place as stored with 産 (a country of imported rice, 米国産).
 */
export function originInJapanese(origin: string): string {
  if (origin === "domestic") return "国産";
  return `${findPrefecture(origin)?.ja ?? origin}産`;
}

/**
 * The origin statement in a reader's language, from origins already weighed (originsByWeight).
 * In Japanese, spellings of one prefecture (Hyogo, Hyōgo) become one entry, and entries are
 * joined by 「、」, largest first: 「兵庫県産、岡山県産」.
 */
export function originStatementIn(origins: { origin: string; share: number }[], locale: "ja" | "en"): string {
  if (locale === "en") return origins.map((o) => o.origin).join(", ");
  return sharesBy(origins, (o) => originInJapanese(o.origin), (o) => o.share).map((o) => o.name).join("、");
}

/** Adds up shares by any key (variety, grower) and sorts them largest first. */
export function sharesBy<T>(items: T[], key: (item: T) => string, share: (item: T) => number) {
  const totals = new Map<string, number>();
  for (const item of items) totals.set(key(item), (totals.get(key(item)) ?? 0) + share(item));
  return [...totals].sort((a, b) => b[1] - a[1]).map(([name, value]) => ({ name, share: value }));
}
