"use client";

import { useActionState } from "react";
import { useTranslations } from "next-intl";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { VARIETY_KINDS, type Variety } from "@/domain/varieties";
import { initialFormState } from "@/lib/form-state";
import { addVarietyAction, removeVarietyAction, saveTankAction } from "./actions";

type Tank = { id: string; name: string; capacityL: number; location: string; active: boolean; holds: string | null };

/** The tank register: one small form per tank, and one to add a tank. */
export function TankRegister({ tanks }: { tanks: Tank[] }) {
  const t = useTranslations("tankRegister");
  return (
    <section className="panel max-w-3xl space-y-4" data-testid="tank-register">
      <h2 className="text-xl font-bold">{t("title")}</h2>
      <p className="text-sm text-ink-soft">{t("intro")}</p>
      {tanks.length ? tanks.map((tank) => <TankRow key={tank.id} tank={tank} />) : <p>{t("none")}</p>}
      <TankRow tank={null} />
    </section>
  );
}

function TankRow({ tank }: { tank: Tank | null }) {
  const t = useTranslations("tankRegister");
  const [state, action, pending] = useActionState(saveTankAction, initialFormState);
  const v = (k: string, saved: string) => (state.ok ? saved : (state.values?.[k] ?? saved));
  const prefix = tank ? tank.id : "new-tank";
  const input = (name: string, saved: string, mode?: "decimal") => (
    <label className="block">
      <span className="field-label">{t(name)}</span>
      <input name={name} id={`${prefix}-${name}`} className="field-input" inputMode={mode} defaultValue={v(name, saved)} aria-invalid={state.fields?.[name] ? true : undefined} />
      {state.fields?.[name] ? <span className="field-error">{state.fields[name]!.join(" ")}</span> : null}
    </label>
  );
  return (
    <form action={action} className="grid gap-3 border-t border-husk pt-3 sm:grid-cols-[1fr_8rem_1fr_auto] sm:items-end" noValidate data-testid={tank ? "tank-row" : "tank-add"}>
      {tank ? <input type="hidden" name="id" value={tank.id} /> : <h3 className="font-semibold sm:col-span-4">{t("addTitle")}</h3>}
      <div className="sm:col-span-4"><FormMessage state={state} /></div>
      {input("name", tank?.name ?? "")}
      {input("capacityL", tank ? String(tank.capacityL) : "", "decimal")}
      {input("location", tank?.location ?? "")}
      <div className="space-y-1">
        {tank ? (
          <>
            <label className="flex items-center gap-2">
              <input type="checkbox" name="active" className="h-5 w-5" defaultChecked={tank.active} />
              {t("active")}
            </label>
            <p className="text-xs text-ink-soft" data-testid="tank-holds">{tank.holds ? `${t("holds")}: ${tank.holds}` : tank.active ? t("empty") : t("inactive")}</p>
            {state.fields?.active ? <p className="field-error">{state.fields.active.join(" ")}</p> : null}
          </>
        ) : (
          <input type="hidden" name="active" value="on" />
        )}
        <button type="submit" className={tank ? "btn-quiet" : "btn"} disabled={pending}>{tank ? t("save") : t("add")}</button>
      </div>
    </form>
  );
}

/** The list of rice varieties a harvest may name. */
export function VarietyList({ varieties }: { varieties: Variety[] }) {
  const t = useTranslations("varietyList");
  const [state, action, pending] = useActionState(addVarietyAction, initialFormState);
  return (
    <section className="panel max-w-3xl space-y-4" data-testid="variety-list">
      <h2 className="text-xl font-bold">{t("title")}</h2>
      <p className="text-sm text-ink-soft">{t("intro")}</p>
      <ul className="divide-y divide-husk">
        {varieties.map((v) => <VarietyRow key={v.name} variety={v} />)}
      </ul>
      <form action={action} className="grid gap-3 sm:grid-cols-[1fr_12rem_auto] sm:items-end" noValidate data-testid="variety-add">
        <div className="sm:col-span-3"><FormMessage state={state} /></div>
        <FormField label={t("name")} name="name" defaultValue={state.ok ? "" : state.values?.name} errors={state.fields?.name} />
        <label>
          <span className="field-label">{t("kind")}</span>
          <select name="kind" className="field-input" defaultValue={state.ok ? "sake" : (state.values?.kind ?? "sake")}>
            {VARIETY_KINDS.map((k) => <option key={k} value={k}>{t(`kinds.${k}`)}</option>)}
          </select>
        </label>
        <button type="submit" className="btn" disabled={pending}>{t("add")}</button>
      </form>
    </section>
  );
}

function VarietyRow({ variety }: { variety: Variety }) {
  const t = useTranslations("varietyList");
  const [state, action, pending] = useActionState(removeVarietyAction, initialFormState);
  return (
    <li className="flex flex-wrap items-center gap-3 py-2">
      <span className="font-semibold">{variety.name}</span>
      <span className="text-sm text-ink-soft">{t(`kinds.${variety.kind}`)}</span>
      <form action={action} className="ml-auto">
        <input type="hidden" name="name" value={variety.name} />
        <button type="submit" className="btn-quiet" disabled={pending} aria-label={`${t("remove")} ${variety.name}`}>{t("remove")}</button>
      </form>
      {state.message && !state.ok ? <FormMessage state={state} /> : null}
    </li>
  );
}
