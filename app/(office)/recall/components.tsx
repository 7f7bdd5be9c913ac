"use client";

import Link from "next/link";
import { useState } from "react";
import { useFormatter, useTranslations } from "next-intl";
import { useQuantity } from "@/lib/use-quantity";

export type ReachedLot = { code: string; kind: string; unit: string; fraction: number; onHand: number; holder: string; recalled: boolean; shippedToBuyer: boolean; hold: string | null };

/** The lots a recall reached; those shipped to a buyer stand out, and can be shown alone. */
export function ReachedLotsTable({ lots }: { lots: ReachedLot[] }) {
  const t = useTranslations();
  const format = useFormatter();
  const amount = useQuantity();
  const [onlyShipped, setOnlyShipped] = useState(false);
  const shown = onlyShipped ? lots.filter((l) => l.shippedToBuyer) : lots;
  return (
    <div className="space-y-3">
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" checked={onlyShipped} onChange={(e) => setOnlyShipped(e.target.checked)} />
        {t("recall.onlyShipped")}
      </label>
      <div className="overflow-x-auto rounded-lg border-2 border-paper-deep bg-white">
        <table className="w-full border-collapse text-sm" aria-label={t("recall.reachedTitle")} data-testid="recall-lots">
          <thead className="bg-paper-deep text-left">
            <tr>
              <th className="px-3 py-2">{t("recall.table.code")}</th>
              <th className="px-3 py-2">{t("recall.table.kind")}</th>
              <th className="px-3 py-2 text-right">{t("recall.table.fraction")}</th>
              <th className="px-3 py-2 text-right">{t("recall.table.onHand")}</th>
              <th className="px-3 py-2">{t("recall.table.holder")}</th>
              <th className="px-3 py-2">{t("holds.column")}</th>
            </tr>
          </thead>
          <tbody>
            {shown.map((lot) => (
              <tr key={lot.code} className={`border-t border-paper-deep ${lot.shippedToBuyer ? "bg-persimmon-pale font-semibold" : ""}`} data-shipped={lot.shippedToBuyer || undefined}>
                <td className="px-3 py-2">
                  <Link href={`/lots/${encodeURIComponent(lot.code)}`} className="code-chip no-underline">{lot.code}</Link>
                  {lot.recalled ? <span className="ml-2 text-ink-soft">({t("recall.table.recalled")})</span> : null}
                  {lot.shippedToBuyer ? <span className="ml-2 text-persimmon">{t("recall.shippedToBuyer")}</span> : null}
                </td>
                <td className="px-3 py-2">{t(`lot.kinds.${lot.kind}`)}</td>
                <td className="px-3 py-2 text-right tabular-nums">{format.number(lot.fraction, { style: "percent", maximumFractionDigits: 1 })}</td>
                <td className="px-3 py-2 text-right tabular-nums">{amount(lot.onHand, lot.unit)}</td>
                <td className="px-3 py-2">{lot.holder}</td>
                <td className="px-3 py-2" data-testid="recall-hold">{lot.hold ? <span className="font-semibold text-persimmon">{t("holds.onHold", { reason: lot.hold })}</span> : <span className="text-ink-soft">{t("holds.notHeld")}</span>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
