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

/** Adds up shares by any key (variety, grower) and sorts them largest first. */
export function sharesBy<T>(items: T[], key: (item: T) => string, share: (item: T) => number) {
  const totals = new Map<string, number>();
  for (const item of items) totals.set(key(item), (totals.get(key(item)) ?? 0) + share(item));
  return [...totals].sort((a, b) => b[1] - a[1]).map(([name, value]) => ({ name, share: value }));
}
