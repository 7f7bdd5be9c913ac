import { getFormatter, getTranslations } from "next-intl/server";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { lastSettingsChange, readSettings, SETTING_DEFAULTS } from "@/server/platform/settings";
import { tankRegisterWithContents } from "@/server/floor/tank-register";
import { readVarietyList } from "@/server/floor/variety-list";
import { RestoreDefaultsForm, SettingsForm } from "./components";
import { can } from "@/domain/permissions";
import { ReadOnlySettings } from "./settings-view";
import { TankRegister, VarietyList } from "./registers";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("settingsPage"))("title") };
}

async function SettingsPage() {
  // The auditor reads the settings; only who may manage them gets the forms.
  const user = await requirePagePermission("setup:read");
  if (!can(user, "settings:manage")) return <ReadOnlySettings />;
  const t = await getTranslations("settingsPage");
  const format = await getFormatter();
  const current = readSettings();
  const last = lastSettingsChange();
  return (
    <div className="space-y-6">
      <PageHeader title={t("title")} intro={t("intro")} className="space-y-2">
        <p className="notice-warn" data-testid="defaults-source">{t("defaultsSource")}</p>
        <p className="text-sm text-ink-soft">
          {last ? t("lastChange", { at: format.dateTime(last.at, "dayTime"), by: last.by }) : t("allDefaults")}
        </p>
      </PageHeader>
      <SettingsForm current={current} defaults={SETTING_DEFAULTS} zones={Intl.supportedValuesOf("timeZone")} />
      <TankRegister tanks={tankRegisterWithContents()} />
      <VarietyList varieties={readVarietyList()} />
      <section className="panel max-w-2xl space-y-3">
        <h2 className="text-xl font-bold">{t("restoreTitle")}</h2>
        <p className="text-sm text-ink-soft">{t("restoreIntro")}</p>
        <RestoreDefaultsForm />
      </section>
    </div>
  );
}

export default withClientMessages(["settingsPage", "tankRegister", "varietyList"], SettingsPage);
