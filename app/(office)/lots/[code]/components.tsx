import Link from "@/components/app-link";
import { getFormatter, getLocale, getTranslations } from "next-intl/server";
import { attributeLines } from "@/lib/event-figures";
import { figureText, quantityText } from "@/lib/quantity";
import type { Translate } from "@/lib/validation/field-errors";
import type { Neighbour } from "@/server/trace/lineage";
import type { ShownLotEvent } from "@/server/ledger/lot-events";

export async function LineageList({ title, empty, items, direction, testId }: { title: string; empty: string; items: Neighbour[]; direction: "back" | "forward"; testId: string }) {
  const t = await getTranslations();
  const format = await getFormatter();
  const pct = (share: number) => format.number(share, { style: "percent", maximumFractionDigits: 1 });
  return (
    <div className="panel" data-testid={testId}>
      <h2 className="mb-3 text-lg font-bold">{title}</h2>
      {items.length === 0 ? (
        <p className="text-ink-soft">{empty}</p>
      ) : (
        <ul className="space-y-2">
          {items.map((n, i) => (
            <li key={n.code ?? `other-${i}`} className="flex flex-wrap items-center gap-3">
              {n.code !== null ? (
                <Link href={`/lots/${n.code}`} className="code-chip no-underline">{n.code}</Link>
              ) : (
                <span className="code-chip opacity-60" title={t("lotPage.hidden")}>{t("lotPage.otherPartyLot")}</span>
              )}
              <span>{t(`lot.kinds.${n.kind}`)}</span>
              <span className="ml-auto font-semibold">
                {direction === "back" ? t("lotPage.shareOfThis", { share: pct(n.share) }) : t("lotPage.shareOfThat", { share: pct(n.share) })}
              </span>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

export async function EventTimeline({ events, lotCode }: { events: ShownLotEvent[]; lotCode: string }) {
  const t = await getTranslations();
  const format = await getFormatter();
  const locale = await getLocale();
  const tr = t as unknown as Translate;
  const qty = (q: number, unit: string) => quantityText(tr, locale, q, unit, 3);
  const when = (d: Date) => format.dateTime(d, "dayTime");
  return (
    <ol className="relative space-y-4 border-l-4 border-husk pl-6" data-testid="event-timeline">
      {events.map((e) => {
        const figures = attributeLines(e.attributes, tr, locale, when);
        return (
        <li key={e.id} id={`event-${e.id}`} className={`panel relative ${e.correctedBy ? "opacity-70" : ""}`}>
          <span className={`absolute top-5 -left-[34px] h-4 w-4 rotate-45 ${e.step === "correcting" ? "bg-persimmon" : "bg-cedar"}`} aria-hidden="true" />
          <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
            <h3 className="text-lg font-bold">{t(`steps.${e.step}`)} <span className="text-sm font-normal text-ink-soft">#{e.id}</span></h3>
            <time dateTime={e.at} className="text-sm">{format.dateTime(new Date(e.at), "dayTime")}</time>
            <span className="text-sm text-ink-soft">
              {t("lotPage.by", { user: e.user.name, party: e.party.name })}
              {e.counterparty ? ` · ${t("lotPage.to", { counterparty: e.counterparty.name })}` : ""}
            </span>
          </div>
          {e.correctedBy ? <p className="mt-2 font-semibold text-persimmon">{t("lotPage.corrected", { id: e.correctedBy })}</p> : null}
          {e.corrects ? <p className="mt-2 font-semibold">{t("lotPage.corrects", { id: e.corrects, reason: e.reason })}</p> : null}
          <div className="mt-3 grid gap-3 text-sm sm:grid-cols-3">
            {e.inputs.length ? (
              <div>
                <p className="font-semibold">{t("lotPage.inputs")}</p>
                <ul>{e.inputs.map((i, n) => <li key={n}>{i.lot === null ? <OtherPartyLot label={t("lotPage.otherPartyLot")} /> : <><LotRef code={i.lot} current={lotCode} /> {i.use === "draw" ? qty(i.quantity, i.unit) : t(`lotPage.uses.${i.use}`)}</>}</li>)}</ul>
              </div>
            ) : null}
            {e.outputs.length ? (
              <div>
                <p className="font-semibold">{t("lotPage.outputs")}</p>
                <ul>{e.outputs.map((o, n) => <li key={n}>{o.lot === null ? <OtherPartyLot label={t("lotPage.otherPartyLot")} /> : <><LotRef code={o.lot} current={lotCode} /> {qty(o.quantity, o.unit)}</>}</li>)}</ul>
              </div>
            ) : null}
            {e.measurements.length ? (
              <div>
                <p className="font-semibold">{t("lotPage.measurements")}</p>
                <ul>{e.measurements.map((m, n) => <li key={n}>{figureText(tr, locale, m.name, m.value, m.unit)}</li>)}</ul>
              </div>
            ) : null}
          </div>
          {figures.length ? (
            <div className="mt-3 text-sm" data-testid="event-figures">
              <p className="font-semibold">{t("lotPage.figuresTitle")}</p>
              <ul className="flex flex-wrap gap-x-4">{figures.map((line, n) => <li key={n}>{line}</li>)}</ul>
            </div>
          ) : null}
          <ReceiptFigures event={e} qty={qty} />
          {e.referenceDoc || e.place || e.note ? (
            <p className="mt-2 text-sm text-ink-soft">
              {[e.referenceDoc && t("lotPage.ref", { ref: e.referenceDoc }), e.place && t("lotPage.place", { place: e.place }), e.note].filter(Boolean).join(" · ")}
            </p>
          ) : null}
        </li>
        );
      })}
    </ol>
  );
}

/** A receipt's slip weight beside the weight on arrival, and the loss in transit as its own figure. */
async function ReceiptFigures({ event, qty }: { event: ShownLotEvent; qty: (q: number, unit: string) => string }) {
  const a = event.attributes as { slipQuantity?: unknown; arrivalQuantity?: unknown; shortfall?: unknown };
  const unit = event.inputs.find((i) => i.unit)?.unit;
  if (event.step !== "receiving" || typeof a.slipQuantity !== "number" || typeof a.arrivalQuantity !== "number" || !unit) return null;
  const t = await getTranslations("lotPage");
  return (
    <p className="mt-2 text-sm font-semibold" data-testid="receipt-figures">
      {t("receiptFigures", { slip: qty(a.slipQuantity, unit), arrival: qty(a.arrivalQuantity, unit), shortfall: qty(Number(a.shortfall ?? 0), unit) })}
    </p>
  );
}

/** A lot of another party in the same event: named neither by code nor by weight. */
function OtherPartyLot({ label }: { label: string }) {
  return <span className="code-chip opacity-60" data-testid="other-party-lot">{label}</span>;
}

function LotRef({ code, current }: { code: string; current: string }) {
  if (code === current) return <span className="code-chip">{code}</span>;
  return <Link href={`/lots/${code}`} className="code-chip no-underline">{code}</Link>;
}
