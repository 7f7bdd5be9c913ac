import { getFormatter, getLocale, getTimeZone, getTranslations } from "next-intl/server";
import { originStatementIn } from "@/domain/origin";
import { daysShown } from "@/i18n/dates";
import type { Provenance } from "@/server/trace/provenance";

type Show = Partial<Record<"varieties" | "origin" | "growers" | "polishingRatio" | "categories" | "dates" | "koji", boolean>>;

/**
 * The provenance answer: what a buyer may be told about a lot, from its lineage. `caution`
 * puts the labelling caution under the categories, for the brewery's own staff.
 */
export async function ProvenanceCard({ p, show = {}, caution = false }: { p: Provenance; show?: Show; caution?: boolean }) {
  const t = await getTranslations("provenance");
  const tc = await getTranslations("caution");
  const tp = await getTranslations("products");
  const format = await getFormatter();
  const locale = (await getLocale()) === "en" ? "en" : "ja";
  const on = (k: keyof Show) => show[k] !== false;
  const pct = (v: number) => format.number(v, { style: "percent", maximumFractionDigits: 1 });
  const date = (iso: string) => format.dateTime(new Date(iso), "day");
  const timeZone = await getTimeZone();
  const days = (isos: string[]) => {
    const shown = daysShown(isos, timeZone);
    return "days" in shown ? shown.days.map(date).join(", ") : t("daysBetween", { first: date(shown.first), last: date(shown.last), count: shown.count });
  };
  const row = (label: string, value: React.ReactNode, testId: string) => (
    <div className="grid gap-1 border-t border-paper-deep py-3 sm:grid-cols-[12rem_1fr]" data-testid={testId}>
      <dt className="font-semibold text-ink-soft">{label}</dt>
      <dd>{value}</dd>
    </div>
  );
  if (p.shares === 0) return <p className="notice">{t("notRice")}</p>;
  // The public page names a claimed category only where the records support it; the office sees the claim and a warning.
  const product = p.product;
  const claim = product?.category && (caution || product.claimSupported) ? product.category : null;
  return (
    <dl className="panel" data-testid="provenance-card">
      {product
        ? row(tp("product"), <>
            <strong>{product.name}</strong>{claim ? ` · ${claim}` : ""}{product.bottleMl ? ` · ${product.bottleMl} mL` : ""}
            {caution && !product.claimSupported ? <><br /><span role="alert" className="notice-warn mt-1 block text-ink" data-testid="claim-warning">{tp("claimWarning", { category: product.category })}</span></> : null}
          </>, "prov-product")
        : null}
      {on("varieties") ? row(t("varieties"), p.varieties.map((v) => `${v.name} ${pct(v.share)}`).join(" · "), "prov-varieties") : null}
      {on("varieties") && p.cropYears.length ? row(t("cropYears"), p.cropYears.join(", "), "prov-crop-years") : null}
      {on("origin") ? row(t("origin"), <><strong>{originStatementIn(p.origins, locale) || "-"}</strong><br /><span className="text-sm text-ink-soft">{t("originHint")}</span></>, "prov-origin") : null}
      {on("growers") ? row(t("growers"), p.growers.map((g) => `${g.name ?? t("unnamedGrower")} ${pct(g.share)}`).join(" · "), "prov-growers") : null}
      {on("polishingRatio") && p.polishingRatiosPct.length ? row(t("polishingRatio"), p.polishingRatiosPct.map((r) => `${format.number(r, { maximumFractionDigits: 1 })} %`).join(", "), "prov-ratio") : null}
      {on("koji") && p.kojiRatioPct !== null ? row(t("kojiRatio"), `${format.number(p.kojiRatioPct, { maximumFractionDigits: 1 })} %`, "prov-koji") : null}
      {on("categories") && p.lot.kind !== "harvest" ? row(t("categories"), <>{p.categories.length ? p.categories.join(", ") : t("noCategory")}{caution ? <><br /><span className="text-sm text-ink-soft" data-testid="labelling-caution">{tc("labelling")}</span></> : null}</>, "prov-categories") : null}
      {on("dates") && p.brewedOn.length ? row(t("brewedOn"), days(p.brewedOn), "prov-brewed") : null}
      {on("dates") && p.pressedOn.length ? row(t("pressedOn"), days(p.pressedOn), "prov-pressed") : null}
      {on("dates") && p.bottledOn.length ? row(t("bottledOn"), days(p.bottledOn), "prov-bottled") : null}
    </dl>
  );
}
