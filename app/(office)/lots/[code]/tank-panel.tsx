import { getFormatter, getTranslations } from "next-intl/server";
import { getQuantity } from "@/lib/get-quantity";
import type { TankSummary } from "@/server/floor/tanks";

/** A tank at a glance: rice, koji and water on the dry basis, and its additions in order. */
export async function TankPanel({ tank }: { tank: TankSummary }) {
  const t = await getTranslations("tank");
  const format = await getFormatter();
  const amount = await getQuantity();
  const kg = (v: number) => amount(v, "kg", 1);
  const figures: [string, string][] = [
    [t("totalRice"), kg(tank.totalRiceKg)],
    [t("kojiRice"), kg(tank.kojiRiceKg)],
    [t("kojiRatio"), tank.kojiRatioPct === null ? "—" : `${tank.kojiRatioPct} %`],
    [t("water"), amount(tank.waterL, "L", 1)],
    [t("waterRatio"), tank.waterRatioPct === null ? "—" : `${tank.waterRatioPct} %`],
    // The labelling standard weighs added alcohol converted to 95 %; the panel shows both weights.
    [t("addedAlcohol"), tank.addedAlcoholKg > 0 ? `${kg(tank.addedAlcoholKg)} · ${t("at95", { kg: format.number(tank.addedAlcohol95Kg, { maximumFractionDigits: 1 }) })}` : kg(0)],
  ];
  const max = Math.max(1, ...tank.additions.map((a) => a.riceKg));
  return (
    <section className="panel space-y-4" data-testid="tank-panel">
      <h2 className="text-xl font-bold">{t("title", { name: tank.name })}</h2>
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
        {figures.map(([k, v]) => (
          <div key={k} className="rounded-md bg-paper p-3">
            <dt className="text-xs font-semibold text-ink-soft">{k}</dt>
            <dd className="text-xl font-bold">{v}</dd>
          </div>
        ))}
      </dl>
      <p className="text-sm text-ink-soft">{t("basis")}</p>
      <ol className="space-y-2" aria-label={t("timeline")}>
        {tank.additions.map((a) => (
          <li key={a.eventId} className={`grid grid-cols-[8rem_1fr] items-center gap-3 ${a.corrected ? "line-through opacity-60" : ""}`}>
            <span className="text-sm">
              <strong>{t(`additions.${a.addition}`)}</strong>
              <br />
              {format.dateTime(new Date(a.at), "day")}
            </span>
            <span>
              <span className="block h-4 rounded bg-cedar" style={{ width: `${(a.riceKg / max) * 100}%` }} aria-hidden="true" />
              <span className="text-sm">{t("additionLine", { rice: format.number(a.riceKg, { maximumFractionDigits: 1 }), koji: a.kojiKg, steamed: a.steamedKg, starter: a.starterKg, water: a.waterL })}</span>
            </span>
          </li>
        ))}
      </ol>
    </section>
  );
}
