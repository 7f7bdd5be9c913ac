"use client";

import { useTranslations } from "next-intl";
import { RequiredMark } from "./code-field";

/**
 * Further bags for one code field of a floor form (several bags of koji for one addition):
 * kept in the form's flat values as `kojiCode+1`, `kojiKg+1`, … so that a queued record
 * keeps them as typed, like every other field.
 */
type Values = Record<string, string>;
const at = (name: string, index: number) => `${name}+${index}`;

function indices(values: Values, codeName: string): number[] {
  const prefix = `${codeName}+`;
  return Object.keys(values)
    .filter((k) => k.startsWith(prefix) && values[k]!.trim() !== "")
    .map((k) => Number(k.slice(prefix.length)))
    .filter(Number.isInteger)
    .sort((a, b) => a - b);
}

/** Every code of the field, the first bag's included, for refusing a bag scanned twice. */
export function bagCodes(values: Values, codeName: string): string[] {
  return [values[codeName] ?? "", ...indices(values, codeName).map((i) => values[at(codeName, i)]!)].map((c) => c.trim().toUpperCase()).filter(Boolean);
}

/** The further bags as event inputs, in the order scanned. */
export function moreBags(values: Values, codeName: string, kgName: string, toNumber: (s: string | undefined) => number) {
  return indices(values, codeName).map((i) => ({ lot: values[at(codeName, i)]!.trim().toUpperCase(), quantity: toNumber(values[at(kgName, i)]) }));
}

/** The weight fields of the further bags, so their errors and required marks find them. */
export function moreBagFields(values: Values, codeName: string, kgName: string) {
  return indices(values, codeName).map((i) => ({ name: at(kgName, i), type: "number" as const }));
}

export function appendBag(values: Values, codeName: string, code: string): Values {
  const next = Math.max(0, ...indices(values, codeName)) + 1;
  return { ...values, [at(codeName, next)]: code };
}

type Props = { values: Values; codeName: string; kgName: string; kgLabel: string; required: ReadonlySet<string>; errors: Record<string, string[]>; onChange: (values: Values) => void };

export function MoreBags({ values, codeName, kgName, kgLabel, required, errors, onChange }: Props) {
  const t = useTranslations("floorScan.codeField");
  const rows = indices(values, codeName);
  if (!rows.length) return null;
  return (
    <ul className="space-y-3" data-testid={`more-bags-${codeName}`}>
      {rows.map((i) => {
        const code = values[at(codeName, i)]!;
        const id = `f-${at(kgName, i)}`;
        const fieldErrors = errors[at(kgName, i)];
        return (
          <li key={i} className="rounded-lg border-2 border-paper/30 p-3">
            <div className="flex items-center justify-between gap-2">
              <span className="code-chip text-xl">{code}</span>
              <button type="button" className="btn-quiet min-h-12 px-3" onClick={() => onChange({ ...values, [at(codeName, i)]: "", [at(kgName, i)]: "" })}>
                {t("remove", { code })}
              </button>
            </div>
            <div className="mt-2 flex items-baseline">
              <label htmlFor={id} className="block text-lg font-semibold">{kgLabel} · {code}</label>
              {required.has(at(kgName, i)) ? <RequiredMark /> : null}
            </div>
            <input
              id={id}
              className="field-input min-h-14 text-2xl"
              inputMode="decimal"
              autoComplete="off"
              aria-required={required.has(at(kgName, i)) || undefined}
              aria-invalid={fieldErrors?.length ? true : undefined}
              value={values[at(kgName, i)] ?? ""}
              onChange={(e) => onChange({ ...values, [at(kgName, i)]: e.target.value })}
            />
            {fieldErrors?.length ? <p className="notice-warn mt-1 text-base text-ink">{fieldErrors.join(" ")}</p> : null}
          </li>
        );
      })}
    </ul>
  );
}
