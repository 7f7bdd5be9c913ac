"use client";

import { useFormatter, useTranslations } from "next-intl";
import { useState } from "react";
import { submitFloorWrite } from "@/lib/offline-queue";

// Polished rice is soaked at about 13–15 % moisture; 40 % is far beyond any dry rice and
// catches a soaked weight typed into the wrong box (common practice).
const MAX_DRY_MOISTURE_PCT = 40;

type Outcome = { tone: "ok" | "queued" | "error" | "invalid"; text: string } | null;

/** A moisture reading on a polished lot, as a `measuring` event that draws nothing. */
export function RecordMoisture({ code }: { code: string }) {
  const t = useTranslations("floorScan.moisture");
  const format = useFormatter();
  const [value, setValue] = useState("");
  const [busy, setBusy] = useState(false);
  const [outcome, setOutcome] = useState<Outcome>(null);

  const record = async (event: React.FormEvent) => {
    event.preventDefault();
    const pct = Number(value.replace(",", "."));
    if (!value.trim() || !Number.isFinite(pct) || pct <= 0 || pct > MAX_DRY_MOISTURE_PCT) {
      setOutcome({ tone: "invalid", text: t("invalid") });
      return;
    }
    setBusy(true);
    const shown = format.number(pct, { maximumFractionDigits: 1 });
    const body = { step: "measuring", inputs: [{ lot: code, quantity: 0 }], measurements: [{ name: "moisturePct", value: pct, unit: "%" }] };
    const written = await submitFloorWrite<{ id: number }>("/api/events", body, t("queueLabel", { value: shown, code }));
    setBusy(false);
    if (written.state === "queued") setOutcome({ tone: "queued", text: t("queued") });
    else if (written.result.ok) setOutcome({ tone: "ok", text: t("recorded", { value: shown, code }) });
    else {
      const { message, code: reason, fields } = written.result.error;
      const detail = [message || reason, ...Object.values(fields ?? {}).flat()].join(" ");
      setOutcome({ tone: "error", text: t("refused", { message: detail }) });
    }
    if (written.state === "queued" || written.result.ok) setValue("");
  };

  return (
    <form onSubmit={record} className="space-y-3" data-testid="record-moisture" noValidate>
      <div className="flex items-end gap-3">
        <label className="min-w-0 flex-1">
          <span className="block font-semibold">{t("label")}</span>
          <input
            value={value}
            onChange={(e) => setValue(e.target.value)}
            inputMode="decimal"
            autoComplete="off"
            aria-invalid={outcome?.tone === "invalid" ? true : undefined}
            className="field-input min-h-14 text-2xl"
          />
        </label>
        <button type="submit" disabled={busy} className="btn min-h-14 border-paper bg-paper px-5 text-lg text-ink hover:bg-paper-deep">
          {busy ? t("recording") : t("record")}
        </button>
      </div>
      {outcome ? (
        <p role={outcome.tone === "ok" || outcome.tone === "queued" ? "status" : "alert"} className={outcome.tone === "ok" || outcome.tone === "queued" ? "notice text-ink" : "notice-warn text-ink"}>
          {outcome.text}
        </p>
      ) : null}
    </form>
  );
}
