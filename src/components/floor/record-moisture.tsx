"use client";

import { useFormatter, useTranslations } from "next-intl";
import { useSearchParams } from "next/navigation";
import { useEffect, useState } from "react";
import { parseTypedNumber } from "@/domain/typed-input";
import { discardQueuedWrite, keepRefusedWrite, readQueuedWrite, setQueueOwner, submitFloorWrite } from "@/lib/offline-queue";

// Polished rice is soaked at about 13–15 % moisture; 40 % is far beyond any dry rice and
// catches a soaked weight typed into the wrong box (common practice).
const MAX_DRY_MOISTURE_PCT = 40;

type Outcome = { tone: "ok" | "queued" | "error" | "invalid"; text: string } | null;

const refusal = (message: string | undefined, fields: Record<string, string[]> | undefined) => [message, ...Object.values(fields ?? {}).flat()].filter(Boolean).join(" ");

/** A moisture reading on a polished lot, as a `measuring` event that draws nothing. */
export function RecordMoisture({ code, userId }: { code: string; userId: string }) {
  const t = useTranslations("floorScan.moisture");
  const format = useFormatter();
  const [value, setValue] = useState("");
  const [busy, setBusy] = useState(false);
  const [outcome, setOutcome] = useState<Outcome>(null);
  const [queuedId, setQueuedId] = useState<string | null>(null);
  const form = { href: `/scan?code=${encodeURIComponent(code)}`, values: { moisturePct: value } };

  // A reading the server refused from the queue opens again here ("Open to fix"), as typed, with its answer.
  const opened = useSearchParams().get("queued");
  useEffect(() => {
    const id = opened;
    if (!id) return;
    setQueueOwner(userId);
    void readQueuedWrite(id).then((item) => {
      if (!item?.form) return;
      setQueuedId(id);
      setValue(item.form.values.moisturePct ?? "");
      setOutcome({ tone: "error", text: t("refused", { message: refusal(item.lastError, item.lastFields) }) });
    });
  }, [opened, userId, t]);

  const record = async (event: React.FormEvent) => {
    event.preventDefault();
    const pct = parseTypedNumber(value) ?? NaN;
    if (!value.trim() || !Number.isFinite(pct) || pct <= 0 || pct > MAX_DRY_MOISTURE_PCT) {
      setOutcome({ tone: "invalid", text: t("invalid") });
      return;
    }
    setBusy(true);
    const shown = format.number(pct, { maximumFractionDigits: 1 });
    const body = { step: "measuring", inputs: [{ lot: code, quantity: 0 }], measurements: [{ name: "moisturePct", value: pct, unit: "%" }] };
    const written = await submitFloorWrite<{ id: number }>("/api/events", body, t("queueLabel", { value: shown, code }), form);
    setBusy(false);
    if (written.state === "queued") setOutcome({ tone: "queued", text: t("queued") });
    else if (written.result.ok) setOutcome({ tone: "ok", text: t("recorded", { value: shown, code }) });
    else {
      const { message, code: reason, fields } = written.result.error;
      setOutcome({ tone: "error", text: t("refused", { message: refusal(message || reason, fields) }) });
      // Refused again: it stays waiting, as now typed, until it is fixed or discarded.
      if (queuedId) await keepRefusedWrite(queuedId, form, body, message || reason, fields);
    }
    if (written.state === "queued" || written.result.ok) {
      if (queuedId) await discardQueuedWrite(queuedId);
      setQueuedId(null);
      setValue("");
    }
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
