"use client";

import { useFormatter, useTranslations } from "next-intl";
import { useQuantity } from "@/lib/use-quantity";
import { daysSince, offerFor, portionOf, type FloorRights } from "@/domain/floor-offer";
import type { ApiLot } from "@/server/ledger/lots";
import { RecordMoisture } from "./record-moisture";
import { FloorLink } from "./floor-link";

/**
 * What a brewer needs at arm's length after a scan, and the next steps as big buttons. The
 * person's rights come worked out from the server (floorRights), not as the role map.
 */
export function FloorLotCard({ lot, rights, userId }: { lot: ApiLot; rights: FloorRights; userId: string }) {
  const t = useTranslations();
  const format = useFormatter();
  const amount = useQuantity();
  const portion = ["soaked", "steamed"].includes(lot.kind) ? portionOf(lot.attributes) : null;
  const rested = lot.polishedAt ? Math.max(0, daysSince(lot.polishedAt)) : null;
  const rows: [string, string, string][] = [
    ["kind", t("floorScan.card.kind"), t(`lot.kinds.${lot.kind}`)],
    ["portion", t("floorScan.card.portion"), portion ? t(`floorForms.purpose.${portion}`) : ""],
    ["variety", t("floorScan.card.variety"), lot.variety ?? ""],
    ["on-hand", t("floorScan.card.onHand"), amount(lot.onHand, lot.unit)],
    ["polishing-ratio", t("floorScan.card.polishingRatio"), lot.polishingRatioPct != null ? `${format.number(lot.polishingRatioPct, { maximumFractionDigits: 1 })} %` : ""],
    ["rested", t("floorScan.card.rested"), rested !== null ? t("floorScan.card.restedDays", { days: rested }) : ""],
  ];
  const offer = offerFor(rights, lot);
  const actions = offer.state === "actions" ? offer.actions : [];

  return (
    <article data-testid="floor-lot-card" aria-labelledby="floor-lot-code" className="space-y-5 rounded-xl border-4 border-koji bg-cedar-deep p-5 text-paper">
      <h2 id="floor-lot-code" className="m-0">
        <span className="code-chip text-3xl font-bold" data-testid="lot-code">{lot.code}</span>
      </h2>
      {lot.hold ? <p role="alert" data-testid="lot-on-hold" className="rounded-lg bg-persimmon p-3 text-xl font-bold text-white">{t("holds.onHold", { reason: lot.hold.reason })}</p> : null}
      <dl className="grid grid-cols-[auto_1fr] gap-x-5 gap-y-2 text-xl">
        {rows
          .filter(([, , value]) => value)
          .map(([id, label, value]) => (
            <div key={id} className="contents">
              <dt className="opacity-80">{label}</dt>
              <dd className="font-bold" data-testid={`lot-${id}`} suppressHydrationWarning={id === "rested"}>
                {value}
              </dd>
            </div>
          ))}
      </dl>
      <nav aria-label={t("floorScan.card.nextStep")}>
        <h3 className="mb-2 text-lg font-semibold opacity-80">{t("floorScan.card.nextStep")}</h3>
        {offer.state === "in-transit" ? <p data-testid="lot-whereabouts" className="text-xl font-bold">{t("floorScan.card.inTransit", { party: offer.to })}</p> : null}
        {offer.state === "held-elsewhere" ? <p data-testid="lot-whereabouts" className="text-xl font-bold">{t("floorScan.card.heldBy", { party: offer.by })}</p> : null}
        {offer.state === "actions" && actions.length === 0 ? <p>{t("floorScan.card.noActions")}</p> : null}
        <ul className="grid gap-3 sm:grid-cols-2">
          {actions.map((action) => (
            <li key={action}>
              <FloorLink href={`/floor/${action}?lot=${encodeURIComponent(lot.code)}`} className="btn min-h-16 w-full border-koji bg-koji text-xl text-ink no-underline hover:bg-koji-pale">
                {t(`floorScan.actions.${action}`)}
              </FloorLink>
            </li>
          ))}
        </ul>
      </nav>
      {lot.kind === "polished" && offer.state === "actions" && rights.actions.includes("measure") ? <RecordMoisture key={lot.code} code={lot.code} userId={userId} /> : null}
      <p>
        <FloorLink href={`/lots/${encodeURIComponent(lot.code)}`} className="inline-flex min-h-12 items-center text-koji-pale">
          {t("floorScan.card.fullRecord", { code: lot.code })}
        </FloorLink>
      </p>
    </article>
  );
}
