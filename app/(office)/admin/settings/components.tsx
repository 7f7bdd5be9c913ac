"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { KOJI_CHECKPOINTS, RICE_USES, type Band } from "@/domain/brewing";
import { initialFormState, type FormState } from "@/lib/form-state";
import { PUBLIC_FIELDS } from "@/lib/validation/settings";
import type { BrewerySettings } from "@/server/platform/settings";
import { restoreDefaultsAction, saveSettingsAction } from "./actions";

type BandGroup = "absorptionBands" | "steamGainBands" | "kojiBands";

export function SettingsForm({ current, defaults, zones }: { current: BrewerySettings; defaults: BrewerySettings; zones: string[] }) {
  const t = useTranslations("settingsPage");
  const [state, action, pending] = useActionState(saveSettingsAction, initialFormState);
  // After a refusal the form shows what was typed; otherwise what is saved.
  const value = (name: string, saved: number) => (state.ok ? undefined : state.values?.[name]) ?? String(saved);
  const group = (key: BandGroup, items: readonly string[], unit: string, labelOf: (k: string) => string) => (
    <fieldset className="panel space-y-4">
      <legend className="px-1 text-lg font-bold">{t(`${key}.title`)}</legend>
      <p className="text-sm text-ink-soft">{t(`${key}.intro`)}</p>
      {items.map((item) => {
        const saved = (current[key] as Record<string, Band>)[item]!;
        const fallback = (defaults[key] as Record<string, Band>)[item]!;
        return (
          <BandFields key={item} name={`${key}.${item}`} legend={labelOf(item)} unit={unit} saved={saved} fallback={fallback} value={value} state={state} />
        );
      })}
    </fieldset>
  );
  return (
    <form action={action} className="max-w-3xl space-y-6" noValidate data-testid="settings-form">
      <FormMessage state={state} />
      {group("absorptionBands", RICE_USES, "%", (u) => t(`uses.${u}`))}
      {group("steamGainBands", RICE_USES, "%", (u) => t(`uses.${u}`))}
      {group("kojiBands", KOJI_CHECKPOINTS, "°C", (c) => t(`checkpoints.${c}`))}
      <fieldset className="panel space-y-3">
        <legend className="px-1 text-lg font-bold">{t("margin.title")}</legend>
        <p className="text-sm text-ink-soft">{t("margin.intro")}</p>
        <div className="max-w-xs">
          <FormField label={t("margin.label")} name="polishingMarginPts" inputMode="decimal" defaultValue={value("polishingMarginPts", current.polishingMarginPts)} errors={state.fields?.polishingMarginPts} />
          <p className="mt-1 text-xs text-ink-soft">{t("defaultIs", { value: `${defaults.polishingMarginPts} ${t("margin.unit")}` })}</p>
        </div>
      </fieldset>
      <fieldset className="panel space-y-3">
        <legend className="px-1 text-lg font-bold">{t("timeZone.title")}</legend>
        <p className="text-sm text-ink-soft">{t("timeZone.intro")}</p>
        <div className="max-w-xs">
          <FormField label={t("timeZone.label")} name="timeZone" list="time-zones" autoComplete="off" defaultValue={(state.ok ? undefined : state.values?.timeZone) ?? current.timeZone} errors={state.fields?.timeZone} />
          <datalist id="time-zones">{zones.map((z) => <option key={z} value={z} />)}</datalist>
          <p className="mt-1 text-xs text-ink-soft">{t("defaultIs", { value: defaults.timeZone })}</p>
        </div>
      </fieldset>
      <fieldset className="panel space-y-3" data-testid="public-fields">
        <legend className="px-1 text-lg font-bold">{t("public.title")}</legend>
        <p className="text-sm text-ink-soft">{t("public.intro")}</p>
        {PUBLIC_FIELDS.map((k) => (
          <label key={k} className="flex items-center gap-3">
            <input type="checkbox" name={`publicProvenance.${k}`} className="h-6 w-6" defaultChecked={current.publicProvenance[k]} />
            {t(`public.${k}`)}
          </label>
        ))}
      </fieldset>
      <button type="submit" className="btn" disabled={pending}>{t("save")}</button>
    </form>
  );
}

function BandFields({ name, legend, unit, saved, fallback, value, state }: { name: string; legend: string; unit: string; saved: Band; fallback: Band; value: (name: string, saved: number) => string; state: FormState }) {
  const t = useTranslations("settingsPage");
  return (
    <fieldset className="grid gap-3 sm:grid-cols-[10rem_1fr_1fr] sm:items-start">
      <legend className="sr-only">{legend}</legend>
      <p aria-hidden="true" className="pt-7 font-semibold">{legend}</p>
      <FormField label={t("from", { unit })} name={`${name}.min`} inputMode="decimal" defaultValue={value(`${name}.min`, saved.min)} errors={state.fields?.[`${name}.min`]} />
      <FormField label={t("to", { unit })} name={`${name}.max`} inputMode="decimal" defaultValue={value(`${name}.max`, saved.max)} errors={state.fields?.[`${name}.max`]} />
      {/* A band moved off its default says so, so the brewery sees what it has set itself. */}
      <p className={`text-xs sm:col-start-2 sm:col-span-2 ${saved.min !== fallback.min || saved.max !== fallback.max ? "font-semibold text-cedar-deep" : "text-ink-soft"}`}>{t("defaultIs", { value: `${fallback.min}–${fallback.max} ${unit}` })}</p>
    </fieldset>
  );
}

export function RestoreDefaultsForm() {
  const t = useTranslations("settingsPage");
  const [state, action, pending] = useActionState(restoreDefaultsAction, initialFormState);
  return (
    <form action={action} className="space-y-3" data-testid="restore-defaults">
      <FormMessage state={state} />
      <button type="submit" className="btn-quiet" disabled={pending}>{t("restore")}</button>
    </form>
  );
}
