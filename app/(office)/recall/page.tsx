import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { LotLookupForm } from "@/components/lot-lookup-form";
import { normaliseLotCode } from "@/domain/lot-code";
import { AppError } from "@/server/platform/errors";
import { requirePageUser } from "@/server/accounts/page-guard";
import { canReadRecall, loadRecall, recallRows, shipmentsToBuyers, type Recall } from "@/server/trace/recall";
import { heldLots } from "@/server/trace/holds";
import { canHoldLots } from "@/domain/permissions";
import { HoldPanel } from "./hold-panel";
import { ReachedLotsTable } from "./components";
import { countByKind, type ReachedLot } from "./table-view";
import { PageHeader } from "@/components/page-header";
import { getQuantity } from "@/lib/get-quantity";
import { CsvDownloadLinks } from "@/components/csv-download-links";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("recall"))("title") };
}

type Search = { code?: string | string[]; page?: string | string[]; shipped?: string | string[] };
const first = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value);

async function RecallPage({ searchParams }: { searchParams: Promise<Search> }) {
  const user = await requirePageUser();
  if (!canReadRecall(user)) forbidden();
  const t = await getTranslations();
  const amount = await getQuantity();
  const search = await searchParams;
  const code = normaliseLotCode(first(search.code) ?? "");
  let recall: Recall | null = null;
  if (code) {
    try {
      // The page lists shipments only; the CSV and EPCIS downloads carry every event.
      recall = loadRecall(user, code, ["shipping"]);
    } catch (error) {
      if (!(error instanceof AppError && error.code === "not_found")) throw error;
    }
  }
  const rows = recall ? recallRows(recall) : [];
  const shipments = shipmentsToBuyers(rows);
  const shipped = new Set(shipments.filter((s) => s.correctedBy === null).map((s) => s.lot));
  const holds = heldLots((recall?.lots ?? []).map((l) => l.code));
  const lots: ReachedLot[] = (recall?.lots ?? []).map((l) => ({ code: l.code, kind: l.kind, unit: l.unit, fraction: l.fraction, onHand: l.onHand, holder: l.holder.name, recalled: l.code === recall!.lot.code, shippedToBuyer: shipped.has(l.code), hold: holds.get(l.code)?.reason ?? null }));
  const api = `/api/trace/${encodeURIComponent(code)}`;
  return (
    <div className="max-w-5xl space-y-6">
      <PageHeader title={t("recall.title")} intro={t("recall.intro")} />
      <LotLookupForm action="/recall" defaultCode={code} />
      {code && !recall ? <p role="alert" className="notice-warn">{t("lookup.notFound", { code })}</p> : null}
      {recall ? (
        <>
          <section className="space-y-2">
            <h2 className="text-2xl font-bold">{t("recall.heading", { code: recall.lot.code, kind: t(`lot.kinds.${recall.lot.kind}`) })}</h2>
            <p>{t("recall.summary", { lots: recall.lots.length - 1, shipments: shipments.length })}</p>
            <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm" aria-label={t("recall.byKindTitle")} data-testid="recall-by-kind">
              {countByKind(lots).map(([kind, count]) => (
                <li key={kind}>{t("recall.kindCount", { kind: t(`lot.kinds.${kind}`), count })}</li>
              ))}
            </ul>
          </section>
          <section className="space-y-2" aria-labelledby="recall-shipments">
            <h3 id="recall-shipments" className="text-xl font-bold">{t("recall.shipmentsTitle")}</h3>
            {shipments.length ? (
              <ul className="space-y-2" data-testid="recall-shipments">
                {shipments.map((s) => (
                  <li key={`${s.eventId}-${s.lot}`} className="notice-warn">
                    {t("recall.shipment", { date: s.at.slice(0, 10), amount: amount(s.quantity, s.unit, 3), lot: s.lot, buyer: s.counterparty })}
                    {s.referenceDoc ? ` · ${t("recall.shipmentRef", { ref: s.referenceDoc })}` : null}
                    {s.correctedBy !== null ? ` · ${t("recall.shipmentCorrected", { id: s.correctedBy })}` : null}
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-ink-soft">{t("recall.noShipments")}</p>
            )}
          </section>
          <HoldPanel code={recall.lot.code} reached={lots.length} held={holds.size} mayHold={canHoldLots(user)} />
          <section className="space-y-2">
            <h3 className="text-xl font-bold">{t("recall.reachedTitle")}</h3>
            <ReachedLotsTable lots={lots} view={{ code: recall.lot.code, page: Number(first(search.page)) || 1, onlyShipped: first(search.shipped) === "1" }} />
          </section>
          <section className="panel space-y-3">
            <h3 className="text-xl font-bold">{t("recall.downloadsTitle")}</h3>
            <p>
              <CsvDownloadLinks href={`${api}/recall.csv`} label={t("recall.downloadCsv")} className="btn" testId="recall-csv" />
              <span className="ml-3 text-sm text-ink-soft">{t("recall.downloadCsvHint")}</span>
            </p>
            <p>
              <a href={`${api}/epcis`} download className="btn-quiet" data-testid="recall-epcis">{t("recall.downloadEpcis")}</a>
              <span className="ml-3 text-sm text-ink-soft">{t("recall.downloadEpcisHint")}</span>
            </p>
          </section>
        </>
      ) : null}
      <p className="notice text-sm">{t("caution.records")}</p>
    </div>
  );
}

export default withClientMessages(["floorScan", "holds"], RecallPage);
