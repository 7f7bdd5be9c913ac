"use client";

import { useEffect, useMemo, useState } from "react";
import { useTranslations } from "next-intl";
import { alcoholAs95Kg } from "@/domain/categories";
import { bandForUse, checkBand, KOJI_CHECKPOINTS, kojiMeasurementName, RICE_USES, waterAbsorptionPct, type Band, type KojiCheckpoint, type RiceUse } from "@/domain/brewing";
import type { FloorAction } from "@/domain/floor-actions";
import { roundPct } from "@/domain/polishing";
import { BOTTLE_SIZES_ML } from "@/domain/steps";
import { CodeField, RequiredMark } from "@/components/floor/code-field";
import { appendBag, bagCodes, moreBagFields, moreBags, MoreBags } from "@/components/floor/more-bags";
import { checkOffline, errorsByField, fieldPaths, requiredFields, unreadNumbers } from "@/lib/floor-form-check";
import { parseTypedNumber } from "@/domain/typed-input";
import { discardQueuedWrite, keepRefusedWrite, readQueuedWrite, setQueueOwner, submitFloorWrite } from "@/lib/offline-queue";
import type { Translate } from "@/lib/validation/field-errors";
import type { ApiLot } from "@/server/ledger/lots";
import { FloorResult, type SentOutput } from "@/components/floor/floor-result";
import { SoakTimer } from "@/components/floor/soak-timer";
import { useQuantity } from "@/lib/use-quantity";
import { FloorLink } from "@/components/floor/floor-link";

type Bands = { absorption: Record<RiceUse, Band>; gain: Record<RiceUse, Band>; koji: Record<KojiCheckpoint, Band> };
type V = Record<string, string>;
// `bags`: the weight field that goes with this code; further bags can be scanned in a row.
type Field = { name: string; type: "number" | "text" | "code" | "select" | "datetime" | "checkbox"; options?: readonly string[]; show?: (v: V) => boolean; bags?: string };
type Result = { id: number; outputs: { code: string; kind: string; quantity: number; unit: string }[]; warnings: string[] };

// Read as people type ("1,260", "１３.５"); what is not a number is NaN, sent as null and refused.
const n = (s: string | undefined) => parseTypedNumber(s ?? "") ?? NaN;
const nowLocal = () => new Date(Date.now() - new Date().getTimezoneOffset() * 60000).toISOString().slice(0, 16);
const iso = (local: string) => (local ? new Date(local).toISOString() : undefined);
const ms = (name: string, value: number, unit: string) => (Number.isFinite(value) ? [{ name, value, unit }] : []);
const code = (s: string | undefined) => (s ?? "").trim().toUpperCase();
const sum = (...xs: number[]) => xs.filter(Number.isFinite).reduce((a, b) => a + b, 0);

/** Fields of each floor screen, and how its values become one event of ../shared/api.md. */
const ACTIONS: Record<FloorAction, { fields: Field[]; defaults: (lot: ApiLot) => V; build: (v: V, lot: ApiLot) => unknown }> = {
  soak: {
    // "mixed": soaked together, each portion's use is decided at the split (no use is sent).
    fields: [{ name: "use", type: "select", options: ["mixed", ...RICE_USES] }, { name: "dryKg", type: "number" }, { name: "drainedKg", type: "number" }, { name: "waterTempC", type: "number" }, { name: "soakMinutes", type: "number" }],
    defaults: () => ({ use: "mixed" }),
    build: (v, lot) => ({ step: "soaking", inputs: [{ lot: lot.code, quantity: n(v.dryKg) }], outputs: [{ kind: "soaked", quantity: n(v.drainedKg), use: v.use === "mixed" ? undefined : v.use }], measurements: [...ms("soakMinutes", n(v.soakMinutes), "min"), ...ms("waterTempC", n(v.waterTempC), "°C")] }),
  },
  steam: {
    fields: [{ name: "drawKg", type: "number" }, { name: "steamedKg", type: "number" }, { name: "steamMinutes", type: "number" }],
    defaults: (lot) => ({ drawKg: String(lot.onHand) }),
    build: (v, lot) => ({ step: "steaming", inputs: [{ lot: lot.code, quantity: n(v.drawKg) }], outputs: [{ kind: "steamed", quantity: n(v.steamedKg) }], measurements: ms("steamMinutes", n(v.steamMinutes), "min") }),
  },
  split: {
    fields: ["kojiKg", "starterKg", "firstKg", "middleKg", "finalKg"].map((name) => ({ name, type: "number" as const })),
    defaults: () => ({}),
    build: (v, lot) => {
      const portions = [
        ["kojiKg", { use: "koji" }],
        ["starterKg", { use: "starter" }],
        ["firstKg", { use: "mash", addition: "first" }],
        ["middleKg", { use: "mash", addition: "middle" }],
        ["finalKg", { use: "mash", addition: "final" }],
      ] as const;
      const outputs = portions.filter(([k]) => Number.isFinite(n(v[k]))).map(([k, a]) => ({ kind: "steamed", quantity: n(v[k]), ...a }));
      return { step: "splitting", inputs: [{ lot: lot.code, quantity: sum(...outputs.map((o) => o.quantity)) }], outputs };
    },
  },
  "koji-check": {
    fields: [{ name: "checkpoint", type: "select", options: KOJI_CHECKPOINTS }, { name: "tempC", type: "number" }, { name: "at", type: "datetime" }],
    defaults: () => ({ checkpoint: "bringingIn", at: nowLocal() }),
    build: (v, lot) => ({ step: "measuring", at: iso(v.at!), inputs: [{ lot: lot.code, quantity: 0 }], measurements: ms(kojiMeasurementName(v.checkpoint as KojiCheckpoint), n(v.tempC), "°C") }),
  },
  koji: {
    fields: [{ name: "drawKg", type: "number" }, { name: "kojiKg", type: "number" }, { name: "sporeG", type: "number" }, { name: "startedAt", type: "datetime" }],
    defaults: (lot) => ({ drawKg: String(lot.onHand) }),
    build: (v, lot) => ({ step: "koji-making", inputs: [{ lot: lot.code, quantity: n(v.drawKg) }], outputs: [{ kind: "koji", quantity: n(v.kojiKg) }], measurements: ms("sporeG", n(v.sporeG), "g"), ...(v.startedAt ? { attributes: { startedAt: iso(v.startedAt) } } : {}) }),
  },
  starter: {
    fields: [{ name: "kojiCode", type: "code" }, { name: "kojiKg", type: "number" }, { name: "steamedCode", type: "code" }, { name: "steamedKg", type: "number" }, { name: "waterL", type: "number" }, { name: "starterKg", type: "number" }],
    defaults: (lot): V => (lot.kind === "koji" ? { kojiCode: lot.code } : { steamedCode: lot.code, steamedKg: String(lot.onHand) }),
    build: (v) => ({
      step: "starter",
      inputs: [{ lot: code(v.kojiCode), quantity: n(v.kojiKg) }, { lot: code(v.steamedCode), quantity: n(v.steamedKg) }],
      outputs: [{ kind: "starter", quantity: Number.isFinite(n(v.starterKg)) ? n(v.starterKg) : sum(n(v.kojiKg), n(v.steamedKg), n(v.waterL)) }],
      measurements: ms("waterL", n(v.waterL), "L"),
    }),
  },
  add: {
    fields: [
      { name: "addition", type: "select", options: ["first", "middle", "final"] },
      // A register tank is picked by name; with no register yet, a name is typed.
      { name: "tankId", type: "select", options: [], show: (v) => v.addition === "first" },
      { name: "tankName", type: "text", show: (v) => v.addition === "first" },
      { name: "ginjoMethod", type: "checkbox", show: (v) => v.addition === "first" },
      { name: "specialMethod", type: "checkbox", show: (v) => v.addition === "first" },
      { name: "tankCode", type: "code", show: (v) => v.addition !== "first" },
      { name: "starterCode", type: "code", show: (v) => v.addition === "first" },
      { name: "starterKg", type: "number", show: (v) => v.addition === "first" },
      { name: "kojiCode", type: "code", bags: "kojiKg" },
      { name: "kojiKg", type: "number" },
      { name: "steamedCode", type: "code", bags: "steamedKg" },
      { name: "steamedKg", type: "number" },
      { name: "waterL", type: "number" },
    ],
    defaults: (lot): V => {
      const addition = String(lot.attributes.addition ?? (lot.kind === "tank" ? "middle" : "first"));
      if (lot.kind === "tank") return { addition, tankCode: lot.code };
      if (lot.kind === "koji") return { addition, kojiCode: lot.code };
      if (lot.kind === "starter") return { addition, starterCode: lot.code, starterKg: String(lot.onHand) };
      return { addition, steamedCode: lot.code, steamedKg: String(lot.onHand) };
    },
    build: (v) => {
      const first = v.addition === "first";
      const inputs = [
        ...(first && v.starterCode ? [{ lot: code(v.starterCode), quantity: n(v.starterKg) }] : []),
        ...(v.kojiCode ? [{ lot: code(v.kojiCode), quantity: n(v.kojiKg) }] : []),
        ...moreBags(v, "kojiCode", "kojiKg", n),
        ...(v.steamedCode ? [{ lot: code(v.steamedCode), quantity: n(v.steamedKg) }] : []),
        ...moreBags(v, "steamedCode", "steamedKg", n),
      ];
      // The mash grows by everything put in: rice, koji, starter and water (1 L ≈ 1 kg).
      const quantity = sum(...inputs.map((i) => i.quantity), n(v.waterL));
      const output = first ? { kind: "tank", quantity, tankId: v.tankId || undefined, tankName: v.tankId ? undefined : v.tankName || undefined, ginjoMethod: v.ginjoMethod === "on", specialMethod: v.specialMethod === "on" } : { lot: code(v.tankCode), quantity };
      return { step: "mash-addition", attributes: { addition: v.addition }, inputs, outputs: [output], measurements: ms("waterL", n(v.waterL), "L") };
    },
  },
  measure: {
    fields: [{ name: "addedAlcoholKg", type: "number" }, { name: "addedAlcoholStrengthPct", type: "number" }, { name: "alcoholPct", type: "number" }, { name: "tempC", type: "number" }],
    defaults: () => ({}),
    build: (v, lot) => ({ step: "measuring", inputs: [{ lot: lot.code, quantity: 0 }], measurements: [...ms("addedAlcoholKg", n(v.addedAlcoholKg), "kg"), ...ms("addedAlcoholStrengthPct", n(v.addedAlcoholStrengthPct), "%"), ...ms("alcoholPct", n(v.alcoholPct), "%"), ...ms("mashTempC", n(v.tempC), "°C")] }),
  },
  press: {
    fields: [{ name: "drawKg", type: "number" }, { name: "sakeL", type: "number" }, { name: "leesKg", type: "number" }],
    defaults: (lot) => ({ drawKg: String(lot.onHand) }),
    build: (v, lot) => ({ step: "pressing", inputs: [{ lot: lot.code, quantity: n(v.drawKg) }], outputs: [{ kind: "sake", quantity: n(v.sakeL) }, ...(Number.isFinite(n(v.leesKg)) ? [{ kind: "lees", quantity: n(v.leesKg) }] : [])] }),
  },
  blend: {
    fields: [{ name: "thisL", type: "number" }, { name: "otherCode", type: "code" }, { name: "otherL", type: "number" }, { name: "blendL", type: "number" }],
    defaults: () => ({}),
    build: (v, lot) => ({ step: "blending", inputs: [{ lot: lot.code, quantity: n(v.thisL) }, { lot: code(v.otherCode), quantity: n(v.otherL) }], outputs: [{ kind: "blend", quantity: Number.isFinite(n(v.blendL)) ? n(v.blendL) : sum(n(v.thisL), n(v.otherL)) }] }),
  },
  bottle: {
    fields: [{ name: "product", type: "select", options: [] }, { name: "bottleMl", type: "select", options: [...BOTTLE_SIZES_ML.map(String), "custom"] }, { name: "customMl", type: "number", show: (v) => v.bottleMl === "custom" }, { name: "count", type: "number" }, { name: "gtin", type: "text" }],
    defaults: () => ({ bottleMl: "720" }),
    build: (v, lot) => {
      const ml = v.bottleMl === "custom" ? n(v.customMl) : n(v.bottleMl);
      const count = n(v.count);
      return { step: "bottling", inputs: [{ lot: lot.code, quantity: Math.round(count * ml) / 1000 }], outputs: [{ kind: "bottled", quantity: count, bottleMl: ml, gtin: (v.gtin ?? "").replace(/\s/g, ""), ...(v.product ? { product: Number(v.product) } : {}) }] };
    },
  },
};

export function FloorActionForm({ action, lot, bands, userId, queuedId, tanks = [], products = [] }: { action: FloorAction; lot: ApiLot; bands: Bands; userId?: string; queuedId?: string; tanks?: FreeTank[]; products?: BottleProduct[] }) {
  const t = useTranslations("floorForms");
  const translate = useTranslations();
  const def = ACTIONS[action];
  const [values, setValues] = useState<V>(() => def.defaults(lot));
  const [queued, setQueued] = useState(false);
  const [pending, setPending] = useState(false);
  const [result, setResult] = useState<Result | null>(null);
  const [problem, setProblem] = useState<{ message: string; fields: Record<string, string[]> } | null>(null);
  const set = (name: string, value: string) => setValues((v) => ({ ...v, [name]: value }));
  const shown = withProducts(withTanks(def.fields, tanks), products).filter((f) => !f.show || f.show(values));
  const checked = [...shown, ...shown.flatMap((f) => (f.bags ? moreBagFields(values, f.name, f.bags) : []))];
  const owners = useMemo(() => fieldPaths((v) => def.build(v, lot), values, checked), [values, def, lot]); // eslint-disable-line react-hooks/exhaustive-deps
  const required = useMemo(() => requiredFields((v) => def.build(v, lot), values, checked), [values, def, lot]); // eslint-disable-line react-hooks/exhaustive-deps
  const byField = problem ? errorsByField(problem.fields, owners) : {};
  const form = { href: `/floor/${action}?lot=${encodeURIComponent(lot.code)}`, values };

  // A record the server refused from the queue opens again with what was typed and its answer.
  useEffect(() => {
    if (!queuedId || !userId) return;
    setQueueOwner(userId);
    void readQueuedWrite(queuedId).then((item) => {
      if (!item?.form) return;
      // Opened from the queue panel on this same screen: leave the "kept on this phone" view.
      setQueued(false);
      setResult(null);
      setValues(item.form.values);
      setProblem({ message: item.lastError ?? "", fields: item.lastFields ?? {} });
    });
  }, [queuedId, userId]);

  const submit = async (e: React.FormEvent) => {
    e.preventDefault();
    const body = def.build(values, lot);
    // The server's own schema, on the phone: a slip is shown now, not after the queue sends it.
    const slips = unreadNumbers(checked, values, owners, translate as unknown as Translate) ?? checkOffline(body, translate as unknown as Translate);
    if (slips) return setProblem({ message: t("fixFields"), fields: slips });
    setPending(true);
    // The queue gives the write its Idempotency-Key and keeps it when the network is down.
    const sent = await submitFloorWrite<Result>("/api/events", body, `${t(`${action}.title`)} · ${lot.code}`, form);
    setPending(false);
    if (sent.state === "queued") {
      if (queuedId) await discardQueuedWrite(queuedId);
      setQueued(true);
      setProblem(null);
      return;
    }
    const res = sent.result;
    if (res.ok) {
      if (queuedId) await discardQueuedWrite(queuedId);
      setResult(res.body);
      setProblem(null);
    } else {
      // Refused again: it stays waiting, as now typed, until it is fixed or discarded.
      if (queuedId) await keepRefusedWrite(queuedId, form, body, res.error.message, res.error.fields);
      setProblem({ message: res.error.message, fields: res.error.fields ?? {} });
    }
  };

  // The outputs sent, in the order the server made them: a split portion's use and addition.
  if (result) return <FloorResult result={result} sent={(def.build(values, lot) as { outputs?: SentOutput[] }).outputs ?? []} carried={action === "steam" && lot.attributes.use ? { use: lot.attributes.use } : {}} />;
  if (queued) {
    return (
      <div className="space-y-4" data-testid="floor-queued">
        <p role="status" className="notice text-ink font-bold">{t("queued")}</p>
        <FloorLink href="/scan" className="btn-quiet min-h-12 w-full">{t("scanNext")}</FloorLink>
      </div>
    );
  }
  return (
    <form onSubmit={submit} className="space-y-4" noValidate data-testid="floor-form">
      <LotLine lot={lot} />
      {problem ? (
        <div role="alert" className="notice-warn text-ink" data-testid="floor-error">
          <p className="font-bold">{problem.message}</p>
          <ul className="mt-1 text-base">{Object.entries(problem.fields).map(([k, msgs]) => <li key={k}>{msgs.join(" ")}</li>)}</ul>
        </div>
      ) : null}
      {required.size ? <p className="text-base opacity-80">{translate("floorScan.codeField.requiredNote")}</p> : null}
      {shown.map((f) => (
        <div key={f.name} className="space-y-3">
          <FieldInput
            field={f}
            label={t(`${action}.${f.name}`)}
            value={values[f.name] ?? ""}
            onChange={(v) => (f.name === "product" ? setValues((old) => pickProduct(old, products, v)) : set(f.name, v))}
            optionLabel={(o) => tankLabel(tanks, o, t("add.tankChoose")) ?? productLabel(products, o, t("bottle.productChoose")) ?? t(`options.${o}`)}
            required={required.has(f.name)}
            errors={byField[f.name]}
            taken={f.bags ? bagCodes(values, f.name) : undefined}
            onAppend={f.bags ? (c) => setValues((v) => appendBag(v, f.name, c)) : undefined}
          />
          {f.bags ? <MoreBags values={values} codeName={f.name} kgName={f.bags} kgLabel={t(`${action}.${f.bags}`)} required={required} errors={byField} onChange={setValues} /> : null}
        </div>
      ))}
      {action === "soak" ? <SoakTimer lot={lot.code} onMinutes={(m) => set("soakMinutes", m)} /> : null}
      <Preview action={action} values={values} bands={bands} />
      <button type="submit" className="btn min-h-16 w-full text-2xl" disabled={pending}>{t(`${action}.submit`)}</button>
    </form>
  );
}

/** Register tanks free for a first addition (a tank still holding mash is not offered). */
export type FreeTank = { id: string; name: string; capacityL: number; location: string };

/** The tank select takes the register's free tanks; without a register the name is typed instead. */
function withTanks(fields: Field[], tanks: FreeTank[]): Field[] {
  if (!fields.some((f) => f.name === "tankId")) return fields;
  return fields.flatMap((f) => (f.name === "tankId" ? (tanks.length ? [{ ...f, options: ["", ...tanks.map((x) => x.id)] }] : []) : f.name === "tankName" && tanks.length ? [] : [f]));
}

function tankLabel(tanks: FreeTank[], id: string, choose: string): string | null {
  if (id === "") return tanks.length ? choose : null;
  const tank = tanks.find((x) => x.id === id);
  return tank ? `${tank.name} · ${tank.capacityL} L${tank.location ? ` · ${tank.location}` : ""}` : null;
}

/** A product of the register, as the bottling form offers it. */
export type BottleProduct = { id: number; name: string; category: string; bottleMl: number; gtin: string };

/** The product select appears once the register has products; picking one fills its size and GTIN. */
function withProducts(fields: Field[], products: BottleProduct[]): Field[] {
  return fields.flatMap((f) => (f.name !== "product" ? [f] : products.length ? [{ ...f, options: ["", ...products.map((p) => String(p.id))] }] : []));
}

function productLabel(products: BottleProduct[], id: string, choose: string): string | null {
  if (id === "") return products.length ? choose : null;
  const p = products.find((x) => String(x.id) === id);
  return p ? `${p.name}${p.category ? ` · ${p.category}` : ""} · ${p.bottleMl} mL` : null;
}

function pickProduct(values: V, products: BottleProduct[], id: string): V {
  const p = products.find((x) => String(x.id) === id);
  if (!p) return { ...values, product: "" };
  const listed = (BOTTLE_SIZES_ML as readonly number[]).includes(p.bottleMl);
  return { ...values, product: id, bottleMl: listed ? String(p.bottleMl) : "custom", customMl: String(p.bottleMl), gtin: p.gtin };
}

function LotLine({ lot }: { lot: ApiLot }) {
  const t = useTranslations("lot");
  const amount = useQuantity();
  return (
    <p className="text-lg">
      <span className="code-chip text-xl">{lot.code}</span> {t(`kinds.${lot.kind}`)} · {t("onHand")}: <strong>{amount(lot.onHand, lot.unit)}</strong>
    </p>
  );
}

type FieldInputProps = { field: Field; label: string; value: string; onChange: (v: string) => void; optionLabel: (o: string) => string; required?: boolean; errors?: string[]; taken?: string[]; onAppend?: (code: string) => void };

function FieldInput({ field, label, value, onChange, optionLabel, required, errors, taken, onAppend }: FieldInputProps) {
  const id = `f-${field.name}`;
  const big = "field-input min-h-14 text-2xl";
  if (field.type === "checkbox") {
    return (
      <label className="flex min-h-12 items-center gap-3 text-lg">
        <input id={id} type="checkbox" className="h-8 w-8" checked={value === "on"} onChange={(e) => onChange(e.target.checked ? "on" : "")} />
        {label}
      </label>
    );
  }
  if (field.type === "code") return <CodeField id={id} label={label} value={value} onChange={onChange} onAppend={onAppend} taken={taken} required={required} errors={errors} />;
  return (
    <div>
      <div className="flex items-baseline">
        <label htmlFor={id} className="block text-lg font-semibold">{label}</label>
        {required ? <RequiredMark /> : null}
      </div>
      {field.type === "select" ? (
        <select id={id} className={big} value={value} onChange={(e) => onChange(e.target.value)}>
          {field.options!.map((o) => <option key={o} value={o}>{optionLabel(o)}</option>)}
        </select>
      ) : (
        <input
          id={id}
          className={big}
          type={field.type === "datetime" ? "datetime-local" : "text"}
          inputMode={field.type === "number" ? "decimal" : undefined}
          autoComplete="off"
          aria-required={required || undefined}
          aria-invalid={errors?.length ? true : undefined}
          aria-describedby={errors?.length ? `${id}-error` : undefined}
          value={value}
          onChange={(e) => onChange(e.target.value)}
        />
      )}
      {errors?.length ? <p id={`${id}-error`} className="notice-warn mt-1 text-base text-ink" data-testid={`${id}-error`}>{errors.join(" ")}</p> : null}
    </div>
  );
}

/** Live figures before saving: absorption against its band, portions against what there is. */
function Preview({ action, values, bands }: { action: FloorAction; values: V; bands: Bands }) {
  const t = useTranslations("floorForms");
  if (action === "soak" && Number.isFinite(n(values.dryKg)) && n(values.dryKg) > 0 && Number.isFinite(n(values.drainedKg))) {
    const pct = waterAbsorptionPct(n(values.dryKg), n(values.drainedKg));
    const band = bandForUse(bands.absorption, values.use);
    const within = checkBand(pct, band) === "within";
    return <p data-testid="absorption-preview" className={within ? "notice text-ink" : "notice-warn text-ink"}>{t("absorptionPreview", { pct: roundPct(pct), min: band.min, max: band.max })}</p>;
  }
  // Common practice: a mash is started from a yeast starter; without one the brewer should know.
  if (action === "add" && values.addition === "first" && !(values.starterCode ?? "").trim()) {
    return <p data-testid="no-starter-preview" className="notice-warn text-ink">{t("add.noStarter")}</p>;
  }
  if (action === "measure" && n(values.addedAlcoholKg) > 0 && n(values.addedAlcoholStrengthPct) > 0) {
    const kg95 = alcoholAs95Kg(n(values.addedAlcoholKg), n(values.addedAlcoholStrengthPct));
    return <p data-testid="alcohol-preview" className="notice text-ink">{t("alcoholPreview", { kg: n(values.addedAlcoholKg), kg95: Math.round(kg95 * 10) / 10 })}</p>;
  }
  if (action === "bottle") {
    const ml = values.bottleMl === "custom" ? n(values.customMl) : n(values.bottleMl);
    const litres = (n(values.count) * ml) / 1000;
    return Number.isFinite(litres) ? <p className="notice text-ink">{t("bottlePreview", { litres })}</p> : null;
  }
  return null;
}
