"use client";

import Link from "@/components/app-link";
import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { GRADES } from "@/domain/grades";
import { VARIETY_KINDS, type Variety } from "@/domain/varieties";
import { initialFormState } from "@/lib/form-state";
import { registerHarvestAction } from "./actions";

/** `varieties`: the brewery's list (Settings → Rice varieties); the server refuses any other name. */
export function HarvestForm({ fields, defaultYear, varieties }: { fields: { id: string; name: string }[]; defaultYear: number; varieties: Variety[] }) {
  const t = useTranslations();
  const [state, action, pending] = useActionState(registerHarvestAction, initialFormState);
  const v = (k: string, d = "") => (state.ok ? d : (state.values?.[k] ?? d));
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-4" noValidate data-testid="harvest-form">
      <div className="sm:col-span-4">
        <FormMessage state={state} />
        {state.ok && state.values?.code ? (
          <p className="mt-2">
            <Link className="btn" href={`/labels?codes=${state.values.code}&layout=bag`}>{t("harvest.printLabels")}</Link>{" "}
            <Link className="code-chip no-underline" href={`/lots/${state.values.code}`}>{state.values.code}</Link>
          </p>
        ) : null}
      </div>
      <label className="sm:col-span-2">
        <span className="field-label">{t("harvest.field")}</span>
        <select name="fieldId" className="field-input" defaultValue={v("fieldId")}>
          {fields.map((f) => <option key={f.id} value={f.id}>{f.name}</option>)}
        </select>
        {state.fields?.fieldId ? <p className="field-error">{state.fields.fieldId.join(" ")}</p> : null}
      </label>
      <label>
        <span className="field-label">{t("harvest.variety")}</span>
        <select name="variety" className="field-input" defaultValue={v("variety")} aria-invalid={state.fields?.variety ? true : undefined}>
          <option value="">{t("varietyList.choose")}</option>
          {VARIETY_KINDS.map((kind) => (
            <optgroup key={kind} label={t(`varietyList.kinds.${kind}`)}>
              {varieties.filter((x) => x.kind === kind).map((x) => <option key={x.name} value={x.name}>{x.name}</option>)}
            </optgroup>
          ))}
        </select>
        {state.fields?.variety ? <p className="field-error">{state.fields.variety.join(" ")}</p> : null}
      </label>
      <FormField label={t("harvest.cropYear")} name="cropYear" inputMode="numeric" defaultValue={v("cropYear", String(defaultYear))} errors={state.fields?.cropYear} />
      <FormField label={t("harvest.brownKg")} name="brownKg" inputMode="decimal" defaultValue={v("brownKg")} errors={state.fields?.brownKg} />
      <FormField label={t("harvest.moisturePct")} name="moisturePct" inputMode="decimal" defaultValue={v("moisturePct")} errors={state.fields?.moisturePct} aria-describedby="moisture-hint" />
      <label>
        <span className="field-label">{t("harvest.grade")}</span>
        <select name="grade" className="field-input" defaultValue={v("grade", "1")}>
          {GRADES.map((g) => <option key={g} value={g}>{t(`lot.grades.${g}`)}</option>)}
        </select>
        {state.fields?.grade ? <p className="field-error">{state.fields.grade.join(" ")}</p> : null}
      </label>
      <FormField label={t("harvest.bags")} name="bags" inputMode="numeric" defaultValue={v("bags")} errors={state.fields?.bags} />
      <p id="moisture-hint" className="text-xs text-ink-soft sm:col-span-4">{t("harvest.moistureHint")} {t("harvest.equivalentHint")}</p>
      <div className="sm:col-span-4"><button type="submit" className="btn" disabled={pending}>{t("harvest.save")}</button></div>
    </form>
  );
}
