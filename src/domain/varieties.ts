/**
 * Rice varieties a harvest may name. Sake-rice (shuzo kotekimai) and table-rice names are
 * public registered variety names; which ones a brewery lists is common practice, not a
 * published list, so the office keeps its own copy in settings (src/server/floor/variety-list.ts).
 */
export const VARIETY_KINDS = ["sake", "table"] as const;
export type VarietyKind = (typeof VARIETY_KINDS)[number];
export type Variety = { name: string; kind: VarietyKind };

// Common practice: the sake-rice varieties most often bought, and the table rice some
// breweries use for futsu-shu. Names as commonly romanised (from memory).
export const DEFAULT_VARIETIES: Variety[] = [
  { name: "Yamada Nishiki", kind: "sake" },
  { name: "Omachi", kind: "sake" },
  { name: "Gohyakumangoku", kind: "sake" },
  { name: "Miyama Nishiki", kind: "sake" },
  { name: "Hattan Nishiki", kind: "sake" },
  { name: "Dewasansan", kind: "sake" },
  { name: "Oseto", kind: "sake" },
  { name: "Aiyama", kind: "sake" },
  { name: "Koshihikari", kind: "table" },
  { name: "Hitomebore", kind: "table" },
  { name: "Akitakomachi", kind: "table" },
];

/** Variety names compare without case and spacing differences ("yamada  nishiki" is Yamada Nishiki). */
export const varietyKey = (name: string) => name.trim().replace(/\s+/g, " ").toLowerCase();

/** The list's own spelling of a typed variety, or null when it is not on the list. */
export function listedVariety(list: readonly Variety[], typed: string): string | null {
  const key = varietyKey(typed);
  return list.find((v) => varietyKey(v.name) === key)?.name ?? null;
}

export type VarietyShare = { variety: string; share: number };

/**
 * Shares of each variety in a mix, from the content (dry rice) each input brought. An input
 * that is itself a mix passes its own shares on pro rata. Shares are rounded to 0.1 % and
 * ordered largest first; they sum to 1 before rounding.
 */
export function varietyShares(parts: { content: number; variety: string | null; varieties?: VarietyShare[] }[]): VarietyShare[] {
  const total = parts.reduce((a, p) => a + p.content, 0);
  if (!(total > 0)) return [];
  const byName = new Map<string, number>();
  for (const p of parts) {
    const own = p.varieties?.length ? p.varieties : p.variety ? [{ variety: p.variety, share: 1 }] : [];
    for (const v of own) byName.set(v.variety, (byName.get(v.variety) ?? 0) + (p.content * v.share) / total);
  }
  return [...byName.entries()].map(([variety, share]) => ({ variety, share: Math.round(share * 1000) / 1000 })).sort((a, b) => b.share - a.share || a.variety.localeCompare(b.variety));
}
