"use client";

import { useFormatter, useTranslations } from "next-intl";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/data-table";
import { FormField } from "@/components/ui/form-field";
import { GRADES } from "@/domain/grades";
import type { GrowerTerms, MillTerms } from "@/domain/supplier-prices";
import { addGrowerContractAction, addMillContractAction } from "./actions";
import { SupplierForm, useSupplierForm } from "./components";

export type ContractRow = { id: number; kind: "grower" | "mill"; variety: string | null; cropYear: number | null; version: number; terms: GrowerTerms | MillTerms; note: string; by: string; createdAt: Date; superseded: boolean };

export function ContractsTable({ rows }: { rows: ContractRow[] }) {
  const t = useTranslations("suppliers");
  const tl = useTranslations("lot");
  const format = useFormatter();
  const n = (v: number) => format.number(v);
  const termsText = (r: ContractRow) => {
    if (r.kind === "mill") {
      return (r.terms as MillTerms).tiers.map((tier) => `${tier.upToRatioPct === null ? t("millContract.tierAbove") : t("millContract.tierUpTo", { pct: tier.upToRatioPct })}: ${n(tier.feePerKgYen)}/kg`).join("; ");
    }
    const g = r.terms as GrowerTerms;
    const prices = GRADES.filter((grade) => g.pricesPerBagYen[grade] !== undefined).map((grade) => t("terms.price", { grade: tl(`grades.${grade}`), price: n(g.pricesPerBagYen[grade]!) })).join(", ");
    // Contracts written before thresholds were set per contract started at the MAFF ceiling, 15.0 %.
    return t("terms.grower", { prices, deduction: n(g.moisture.deductionYenPerBagPerStep), step: String(g.moisture.stepPct), threshold: format.number(g.moisture.thresholdPct ?? 15, { minimumFractionDigits: 1 }) });
  };
  const columns: ColumnDef<ContractRow, any>[] = [
    { id: "scope", accessorFn: (r) => (r.kind === "mill" ? t("kindLabels.mill") : `${r.variety} ${r.cropYear}`), header: t("columns.scope") },
    { accessorKey: "version", header: t("columns.version"), cell: (c) => `v${c.getValue()} · ${c.row.original.superseded ? t("detail.superseded") : t("detail.inForce")}` },
    { id: "terms", accessorFn: termsText, header: t("columns.terms") },
    { accessorKey: "note", header: t("growerContract.note") },
    { accessorKey: "createdAt", header: t("columns.date"), cell: (c) => format.dateTime(c.getValue(), "day") },
    { accessorKey: "by", header: t("columns.recordedBy") },
  ];
  return <DataTable data={rows} columns={columns} label={t("detail.contracts")} testId="contracts-table" exportName="grainline-contracts" />;
}

export function GrowerContractForm({ partyId, defaultYear }: { partyId: string; defaultYear: number }) {
  const t = useTranslations("suppliers.growerContract");
  const tl = useTranslations("lot");
  const f = useSupplierForm(addGrowerContractAction);
  return (
    <SupplierForm form={f} partyId={partyId} testId="grower-contract-form" columns={3} submit={t("save")}>
      <FormField label={t("variety")} name="variety" defaultValue={f.v("variety")} errors={f.state.fields?.variety} />
      <FormField label={t("cropYear")} name="cropYear" inputMode="numeric" defaultValue={f.v("cropYear", String(defaultYear))} errors={f.state.fields?.cropYear} />
      <FormField label={t("note")} name="note" defaultValue={f.v("note")} errors={f.state.fields?.note} />
      <fieldset className="grid gap-3 sm:col-span-3 sm:grid-cols-6">
        <legend className="field-label mb-1">{t("pricesLegend")}</legend>
        {GRADES.map((g) => (
          <FormField key={g} label={tl(`grades.${g}`)} name={`price-${g}`} inputMode="numeric" defaultValue={f.v(`price-${g}`)} errors={f.state.fields?.[`prices.${g}`]} />
        ))}
        {f.state.fields?.prices ? <p className="field-error sm:col-span-6">{f.state.fields.prices.join(" ")}</p> : null}
      </fieldset>
      <fieldset className="grid gap-3 sm:col-span-3 sm:grid-cols-3">
        <legend className="field-label mb-1">{t("moistureLegend")}</legend>
        <FormField label={t("threshold")} name="moistureThresholdPct" inputMode="decimal" defaultValue={f.v("moistureThresholdPct", "15.0")} errors={f.state.fields?.moistureThresholdPct} aria-describedby={f.state.fields?.moistureThresholdPct ? "moistureThresholdPct-error moisture-threshold-hint" : "moisture-threshold-hint"} />
        <div>
          <label htmlFor="moistureStepPct" className="field-label">{t("step")}</label>
          <select id="moistureStepPct" name="moistureStepPct" className="field-input" defaultValue={f.v("moistureStepPct", "0.1")}>
            <option value="0.1">{t("stepTenth")}</option>
            <option value="0.5">{t("stepHalf")}</option>
            <option value="1">{t("stepPoint")}</option>
          </select>
        </div>
        <FormField label={t("deduction")} name="moistureDeductionYen" inputMode="numeric" defaultValue={f.v("moistureDeductionYen", "0")} errors={f.state.fields?.moistureDeductionYen} />
        <p id="moisture-threshold-hint" className="text-xs text-ink-soft sm:col-span-3">{t("thresholdHint")}</p>
      </fieldset>
    </SupplierForm>
  );
}

/** Starts from the tiers in force, so that a new version changes only what differs. */
export function MillContractForm({ partyId, current }: { partyId: string; current: MillTerms["tiers"] }) {
  const t = useTranslations("suppliers.millContract");
  const f = useSupplierForm(addMillContractAction);
  const given = current.map((tier) => [tier.upToRatioPct === null ? "" : String(tier.upToRatioPct), String(tier.feePerKgYen)]);
  const defaults = [...given, ...[["50", ""], ["60", ""], ["70", ""], ["", ""]].slice(given.length)].slice(0, 4);
  return (
    <SupplierForm form={f} partyId={partyId} testId="mill-contract-form" columns={1} submit={t("save")}>
      <fieldset className="grid gap-3 sm:grid-cols-4">
        <legend className="field-label mb-1">{t("tiersLegend")}</legend>
        {defaults.map(([upTo, fee], n) => (
          <div key={n} className="space-y-2 rounded border border-paper-deep bg-white p-3">
            <p className="text-sm font-semibold">{t("tier", { n: n + 1 })}</p>
            <FormField label={t("upTo")} name={`tier${n}-upTo`} inputMode="decimal" defaultValue={f.v(`tier${n}-upTo`, upTo)} errors={f.state.fields?.[`tiers.${n}.upToRatioPct`]} />
            <FormField label={t("fee")} name={`tier${n}-fee`} inputMode="numeric" defaultValue={f.v(`tier${n}-fee`, fee)} errors={f.state.fields?.[`tiers.${n}.feePerKgYen`]} />
          </div>
        ))}
      </fieldset>
      {f.state.fields?.tiers ? <p className="field-error">{f.state.fields.tiers.join(" ")}</p> : null}
      <FormField label={t("note")} name="note" defaultValue={f.v("note")} errors={f.state.fields?.note} />
    </SupplierForm>
  );
}
