"use client";

import Link from "@/components/app-link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useTranslations } from "next-intl";
import { CodeField } from "@/components/floor/code-field";
import { postJson } from "@/lib/api-client";
import { parseTypedNumber } from "@/domain/typed-input";

type Row = { lot: string; quantity: string };
type Result = { id: number; outputs: { code: string; kind: string; quantity: number; unit: string }[]; warnings: string[] };

// Read as people type ("1,260", "１３.５"); text that is no number goes as NaN (null), which the schema refuses.
const num = (v: string) => (v.trim() === "" ? undefined : (parseTypedNumber(v) ?? NaN));

/** A polishing run typed at the mill: harvest lots by code with the brown weight drawn from each. */
export function PolishingRunForm() {
  const t = useTranslations("polishing");
  const router = useRouter();
  const [rows, setRows] = useState<Row[]>([{ lot: "", quantity: "" }, { lot: "", quantity: "" }]);
  const [f, setF] = useState({ polished: "", bran: "", target: "", tgwBrown: "", tgwPolished: "", moisture: "", note: "" });
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [result, setResult] = useState<Result | null>(null);
  const [pending, setPending] = useState(false);
  const [key, setKey] = useState(() => crypto.randomUUID());
  // Set once the server has said the lots are of different varieties and the miller ticks the box.
  const [mixConfirmed, setMixConfirmed] = useState(false);

  const submit = async (e: React.FormEvent) => {
    e.preventDefault();
    setPending(true);
    const measurements = [
      ["targetPolishingRatioPct", f.target, "%"],
      ["thousandGrainWeightBrownG", f.tgwBrown, "g"],
      ["thousandGrainWeightPolishedG", f.tgwPolished, "g"],
      ["moisturePct", f.moisture, "%"],
    ]
      .filter(([, v]) => v!.trim() !== "")
      .map(([name, v, unit]) => ({ name, value: num(v!), unit }));
    const body = {
      step: "polishing",
      inputs: rows.filter((r) => r.lot.trim()).map((r) => ({ lot: r.lot.trim().toUpperCase(), quantity: num(r.quantity) })),
      outputs: [{ kind: "polished", quantity: num(f.polished) }, ...(f.bran.trim() ? [{ kind: "bran", quantity: num(f.bran) }] : [])],
      measurements,
      ...(f.note.trim() ? { note: f.note.trim() } : {}),
      ...(mixConfirmed ? { attributes: { mixedVarietiesConfirmed: true } } : {}),
    };
    const res = await postJson<Result>("/api/events", body, key);
    setPending(false);
    if (res.ok) {
      setResult(res.body);
      setErrors({});
      setMessage(null);
      setKey(crypto.randomUUID());
      router.refresh();
    } else {
      setErrors(res.error.fields ?? {});
      setMessage(res.status === 0 ? t("offline") : res.error.message);
    }
  };

  const err = (name: string) => (errors[name]?.length ? <p className="field-error">{errors[name]!.join(" ")}</p> : null);
  const field = (name: keyof typeof f, label: string, hint?: string) => (
    <label className="block">
      <span className="field-label">{label}</span>
      <input className="field-input" inputMode="decimal" value={f[name]} onChange={(e) => setF({ ...f, [name]: e.target.value })} aria-describedby={hint ? `${name}-hint` : undefined} />
      {hint ? <span id={`${name}-hint`} className="text-xs text-ink-soft">{hint}</span> : null}
    </label>
  );

  if (result) {
    const polished = result.outputs.find((o) => o.kind === "polished")!;
    return (
      <div className="space-y-3" data-testid="polishing-result">
        <p className="notice" role="status">{t("recorded", { code: polished.code })}</p>
        {result.warnings.map((w) => <p key={w} className="notice-warn" role="alert">{w}</p>)}
        <ul className="flex flex-wrap gap-3">
          {result.outputs.map((o) => <li key={o.code}><Link href={`/lots/${o.code}`} className="code-chip no-underline">{o.code}</Link></li>)}
        </ul>
        <div className="flex gap-3">
          <Link className="btn" href={`/labels?codes=${result.outputs.map((o) => o.code).join(",")}`}>{t("printLabels")}</Link>
          <button type="button" className="btn-quiet" onClick={() => { setResult(null); setMixConfirmed(false); setRows([{ lot: "", quantity: "" }, { lot: "", quantity: "" }]); setF({ polished: "", bran: "", target: "", tgwBrown: "", tgwPolished: "", moisture: "", note: "" }); }}>{t("another")}</button>
        </div>
      </div>
    );
  }

  return (
    <form onSubmit={submit} className="space-y-5" noValidate data-testid="polishing-form">
      {message ? <p className="notice-warn" role="alert">{message}</p> : null}
      <fieldset className="space-y-2">
        <legend className="font-semibold">{t("inputs")}</legend>
        {err("inputs")}
        {rows.map((r, n) => (
          <div key={n} className="flex flex-wrap items-start gap-3">
            <div>
              {/* A scan while this row holds a code adds the next harvest lot as a new row. */}
              <CodeField
                id={`harvest-${n}`}
                variant="office"
                label={t("harvestCode", { n: n + 1 })}
                value={r.lot}
                onChange={(lot) => setRows(rows.map((x, i) => (i === n ? { ...x, lot } : x)))}
                onAppend={(lot) => setRows((now) => [...now.filter((x) => x.lot.trim() !== "" || x.quantity !== ""), { lot, quantity: "" }])}
                taken={rows.map((x) => x.lot.trim().toUpperCase()).filter(Boolean)}
              />
              {err(`inputs.${n}.lot`)}
            </div>
            <label>
              <span className="field-label">{t("brownKg", { n: n + 1 })}</span>
              <input className="field-input w-32" inputMode="decimal" value={r.quantity} onChange={(e) => setRows(rows.map((x, i) => (i === n ? { ...x, quantity: e.target.value } : x)))} />
              {err(`inputs.${n}.quantity`)}
            </label>
          </div>
        ))}
        <button type="button" className="btn-quiet" onClick={() => setRows([...rows, { lot: "", quantity: "" }])}>{t("addLot")}</button>
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-3">
        {field("polished", t("polishedKg"))}
        {field("bran", t("branKg"))}
        {field("target", t("target"))}
        {field("tgwBrown", t("tgwBrown"), t("tgwHint"))}
        {field("tgwPolished", t("tgwPolished"))}
        {field("moisture", t("moisture"))}
      </div>
      {err("outputs")}
      {err("outputs.0.quantity")}
      {err("measurements")}
      {errors["attributes.mixedVarietiesConfirmed"] || mixConfirmed ? <MixConfirm warning={errors["attributes.mixedVarietiesConfirmed"]} checked={mixConfirmed} onChange={setMixConfirmed} /> : null}
      <label className="block">
        <span className="field-label">{t("note")}</span>
        <input className="field-input" value={f.note} maxLength={2000} onChange={(e) => setF({ ...f, note: e.target.value })} />
      </label>
      <button type="submit" className="btn" disabled={pending}>{t("record")}</button>
    </form>
  );
}

/** Two varieties polished together: the server's warning, and the box that confirms the mix. */
function MixConfirm({ warning, checked, onChange }: { warning?: string[]; checked: boolean; onChange: (v: boolean) => void }) {
  const t = useTranslations("varietyList");
  return (
    <div className="notice-warn space-y-2" data-testid="mix-confirm">
      {warning?.length ? <p role="alert">{warning.join(" ")}</p> : null}
      <label className="flex items-center gap-3 font-semibold">
        <input type="checkbox" className="h-6 w-6" checked={checked} onChange={(e) => onChange(e.target.checked)} />
        {t("mixCheckbox")}
      </label>
    </div>
  );
}
