"use client";

import { useTranslations } from "next-intl";
import { useQuantity } from "@/lib/use-quantity";
import { actionsFor, portionOf } from "@/domain/floor-offer";
import type { LotKind } from "@/domain/steps";
import { FloorLink } from "./floor-link";

export type FloorWriteResult = { id: number; outputs: { code: string; kind: string; quantity: number; unit: string }[]; warnings: string[] };
/** What the form sent for each output (a split portion's use and addition), in the same order. */
export type SentOutput = { kind?: string; use?: unknown; addition?: unknown };

/**
 * After a record: each new lot with what it is for, its label, and its next likely step one
 * tap away. Steamed rice carries the soaked lot's use (src/server/floor/floor-steps.ts), so `carried`
 * stands in for the attributes the server copies on.
 */
export function FloorResult({ result, sent, carried }: { result: FloorWriteResult; sent: SentOutput[]; carried: Record<string, unknown> }) {
  const t = useTranslations("floorForms");
  const tActions = useTranslations("floorScan.actions");
  const amount = useQuantity();
  return (
    <div className="space-y-4" data-testid="floor-result">
      <p role="status" className="notice text-ink">{t("recorded")}</p>
      {result.warnings.map((w) => <p key={w} role="alert" className="notice-warn text-ink font-bold">{w}</p>)}
      <ul className="space-y-4">
        {result.outputs.map((o, i) => {
          const spec = sent[i] ?? {};
          const attributes = { ...carried, ...(spec.use ? { use: spec.use } : {}), ...(spec.addition ? { addition: spec.addition } : {}) };
          const purpose = portionOf(attributes);
          const next = actionsFor(o.kind as LotKind, attributes)[0];
          return (
            <li key={o.code} className="space-y-2 rounded-lg border-2 border-cedar p-3" data-testid="floor-output">
              <p className="flex flex-wrap items-center gap-3">
                <span className="code-chip text-xl">{o.code}</span>
                <span>{amount(o.quantity, o.unit, 3)}</span>
                {purpose ? <strong data-testid="output-purpose">{t(`purpose.${purpose}`)}</strong> : null}
              </p>
              <p className="flex flex-wrap gap-3">
                {next ? (
                  <FloorLink href={`/floor/${next}?lot=${encodeURIComponent(o.code)}`} className="btn min-h-12" data-testid="next-step">
                    {t("nextStep", { step: tActions(next) })}
                  </FloorLink>
                ) : null}
                <FloorLink href={`/scan?code=${o.code}`} className="btn-quiet min-h-12">{t("openLot")}</FloorLink>
                <FloorLink href={`/labels?codes=${o.code}&layout=bag`} className="btn-quiet min-h-12">{t("label")}</FloorLink>
              </p>
            </li>
          );
        })}
      </ul>
      <FloorLink href="/scan" className="btn-quiet min-h-12 w-full">{t("scanNext")}</FloorLink>
    </div>
  );
}
