import Link from "@/components/app-link";
import { getTranslations } from "next-intl/server";
import { getQuantity } from "@/lib/get-quantity";
import { PageHeader } from "@/components/page-header";
import { can } from "@/domain/permissions";
import { requirePageUser } from "@/server/accounts/page-guard";
import { searchEverything } from "@/server/trace/search";
import { SearchSection } from "./components";

export async function generateMetadata() {
  return { title: (await getTranslations("search"))("title") };
}

/** Results of the header's search box, by kind; only what the reader may see. */
export default async function SearchPage({ searchParams }: { searchParams: Promise<{ q?: string | string[] }> }) {
  const user = await requirePageUser();
  const t = await getTranslations();
  const amount = await getQuantity();
  const raw = (await searchParams).q;
  const r = searchEverything(user, typeof raw === "string" ? raw : "");
  const lot = (l: { code: string; kind: string; onHand: number; unit: string; product: string | null }) => (
    <><Link href={`/lots/${l.code}`} className="code-chip">{l.code}</Link> {t(`lot.kinds.${l.kind}`)}{l.product ? ` · ${l.product}` : ""} · {amount(l.onHand, l.unit)}</>
  );
  const none = [r.lots, r.bottlings, r.products, r.tanks, r.tankRegister, r.growers, r.fields].every((x) => x.length === 0);
  return (
    <div className="max-w-4xl space-y-6">
      <PageHeader title={t("search.title")} intro={r.query ? t("search.for", { query: r.query }) : t("search.intro")} />
      {r.query && none ? <p role="status" className="notice" data-testid="search-none">{t("search.none", { query: r.query })}</p> : null}
      <SearchSection title={t("search.lots")} testId="search-lots" items={r.lots.map((l) => ({ key: l.code, body: lot(l) }))} />
      <SearchSection title={t("search.bottlings")} testId="search-bottlings" items={r.bottlings.map((l) => ({ key: l.code, body: lot(l) }))} />
      <SearchSection
        title={t("search.products")}
        testId="search-products"
        items={r.products.map((p) => ({
          key: String(p.id),
          body: <>{can(user, "settings:manage") ? <Link href="/admin/products">{p.name}</Link> : <strong>{p.name}</strong>} · {p.category || t("products.noClaim")} · {p.bottleMl} mL · <span className="font-[family-name:var(--font-code)]">{p.gtin}</span></>,
        }))}
      />
      <SearchSection title={t("search.tanks")} testId="search-tanks" items={r.tanks.map((l) => ({ key: l.code, body: <><strong>{l.name}</strong> · {lot(l)}</> }))} />
      <SearchSection
        title={t("search.tankRegister")}
        testId="search-tank-register"
        items={r.tankRegister.map((x) => ({ key: x.id, body: <><strong>{x.name}</strong> · {x.capacityL} L{x.location ? ` · ${x.location}` : ""}{x.active ? "" : ` · ${t("search.inactive")}`}</> }))}
      />
      <SearchSection
        title={t("search.growers")}
        testId="search-growers"
        items={r.growers.map((g) => ({ key: g.id, body: <Link href={can(user, "parties:manage") ? `/admin/parties/${g.id}` : "/fields"}>{g.name}</Link> }))}
      />
      <SearchSection title={t("search.fields")} testId="search-fields" items={r.fields.map((f) => ({ key: f.id, body: <><Link href="/fields">{f.name}</Link> · {f.region} · {f.growerName}</> }))} />
    </div>
  );
}
