import { getFormatter, getTranslations } from "next-intl/server";
import { PageHeader } from "@/components/page-header";
import { KOJI_CHECKPOINTS, RICE_USES, type Band } from "@/domain/brewing";
import { PUBLIC_FIELDS } from "@/lib/validation/settings";
import { lastSettingsChange, readSettings, type BrewerySettings } from "@/server/platform/settings";
import { tankRegisterWithContents } from "@/server/floor/tank-register";
import { readVarietyList } from "@/server/floor/variety-list";

type BandGroup = "absorptionBands" | "steamGainBands" | "kojiBands";

/** The settings page of a reader who may not change it. */
export async function ReadOnlySettings() {
  const t = await getTranslations();
  const format = await getFormatter();
  const last = lastSettingsChange();
  return (
    <div className="space-y-6">
      <PageHeader title={t("settingsPage.title")} intro={t("settingsPage.intro")} className="space-y-2">
        <p className="notice text-sm">{t("users.readOnly")}</p>
        <p className="text-sm text-ink-soft">
          {last ? t("settingsPage.lastChange", { at: format.dateTime(last.at, "dayTime"), by: last.by }) : t("settingsPage.allDefaults")}
        </p>
      </PageHeader>
      <SettingsView current={readSettings()} />
      <RegistersView />
    </div>
  );
}

/** The settings as they stand, for a reader who may not change them (the auditor): no form, no button. */
export async function SettingsView({ current }: { current: BrewerySettings }) {
  const t = await getTranslations("settingsPage");
  const group = (key: BandGroup, items: readonly string[], unit: string, labelOf: (k: string) => string) => (
    <section className="panel space-y-2">
      <h2 className="text-lg font-bold">{t(`${key}.title`)}</h2>
      <dl className="grid grid-cols-[12rem_1fr] gap-1 text-sm">
        {items.map((item) => {
          const band = (current[key] as Record<string, Band>)[item]!;
          return [<dt key={`${item}-t`} className="font-semibold">{labelOf(item)}</dt>, <dd key={`${item}-d`}>{`${band.min}–${band.max} ${unit}`}</dd>];
        })}
      </dl>
    </section>
  );
  return (
    <div className="max-w-3xl space-y-6" data-testid="settings-view">
      {group("absorptionBands", RICE_USES, "%", (u) => t(`uses.${u}`))}
      {group("steamGainBands", RICE_USES, "%", (u) => t(`uses.${u}`))}
      {group("kojiBands", KOJI_CHECKPOINTS, "°C", (c) => t(`checkpoints.${c}`))}
      <section className="panel space-y-2">
        <h2 className="text-lg font-bold">{t("margin.title")}</h2>
        <p className="text-sm">{`${t("margin.label")}: ${current.polishingMarginPts} ${t("margin.unit")}`}</p>
      </section>
      <section className="panel space-y-2">
        <h2 className="text-lg font-bold">{t("timeZone.title")}</h2>
        <p className="text-sm">{`${t("timeZone.label")}: ${current.timeZone}`}</p>
      </section>
      <section className="panel space-y-2">
        <h2 className="text-lg font-bold">{t("public.title")}</h2>
        <ul className="text-sm">
          {PUBLIC_FIELDS.map((k) => (
            <li key={k}>{`${t(`public.${k}`)}: ${current.publicProvenance[k] ? t("shown") : t("hidden")}`}</li>
          ))}
        </ul>
      </section>
    </div>
  );
}

/** The tank register and the variety list, as the auditor reads them. */
async function RegistersView() {
  const t = await getTranslations();
  return (
    <div className="max-w-3xl space-y-6">
      <section className="panel space-y-2" data-testid="tank-register-view">
        <h2 className="text-lg font-bold">{t("tankRegister.title")}</h2>
        <ul className="text-sm">
          {tankRegisterWithContents().map((tank) => (
            <li key={tank.id}>{`${tank.name} · ${tank.capacityL} L · ${tank.location || "—"} · ${tank.active ? (tank.holds ?? t("tankRegister.empty")) : t("tankRegister.inactive")}`}</li>
          ))}
        </ul>
      </section>
      <section className="panel space-y-2" data-testid="variety-list-view">
        <h2 className="text-lg font-bold">{t("varietyList.title")}</h2>
        <ul className="text-sm">
          {readVarietyList().map((v) => (
            <li key={v.name}>{`${v.name} · ${t(`varietyList.kinds.${v.kind}`)}`}</li>
          ))}
        </ul>
      </section>
    </div>
  );
}
