import Link from "@/components/app-link";
import { notFound } from "next/navigation";
import { getFormatter, getTranslations } from "next-intl/server";
import { AttachmentsPanel } from "@/components/attachments-panel";
import { LotCardView } from "@/components/lot-card-view";
import { normaliseLotCode } from "@/domain/lot-code";
import { roundPct } from "@/domain/polishing";
import { lotAttachments } from "@/server/records/attachments";
import { correctableIds } from "@/server/ledger/correction-rights";
import { tankSummary } from "@/server/floor/tanks";
import { TankPanel } from "./tank-panel";
import { neighbours } from "@/server/trace/lineage";
import { listLotEvents } from "@/server/ledger/lot-events";
import { findLot, findLotId } from "@/server/ledger/lots";
import { requirePageUser } from "@/server/accounts/page-guard";
import { EventTimeline, LineageList } from "./components";
import { CorrectionForm } from "./correction-form";
import { HoldSection } from "./hold-section";
import { ShipmentForm } from "./shipment-form";
import { lotHoldState } from "@/server/trace/holds";
import { listParties } from "@/server/ledger/parties";
import { can, canActOnLot, canHoldLots } from "@/domain/permissions";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata({ params }: { params: Promise<{ code: string }> }) {
  return { title: normaliseLotCode((await params).code) };
}

async function LotPage({ params }: { params: Promise<{ code: string }> }) {
  const user = await requirePageUser();
  const code = normaliseLotCode(decodeURIComponent((await params).code));
  const lot = findLot(user, code);
  const lotId = findLotId(user, code);
  if (!lot || lotId === null) notFound();
  const t = await getTranslations("lotPage");
  const format = await getFormatter();
  const history = listLotEvents(user, code);
  const lineage = neighbours(user, lotId);
  const making = history.find((e) => e.outputs.some((o) => o.lot === code) && e.step === "polishing");
  const run = making?.attributes as { targetPolishingRatioPct?: number; achievedPolishingRatioPct?: number; missedTarget?: boolean; marginPts?: number } | undefined;
  const files = lotAttachments(user, code);
  // The form offers only what the server would take: the same rule (src/domain/corrections.ts).
  const open = history.filter((e) => e.step !== "correcting" && !e.correctedBy);
  const mayCorrect = correctableIds(user, open.map((e) => ({ id: e.id, userId: e.user.id, partyId: e.party.id })));
  const correctable = open.filter((e) => mayCorrect.has(e.id));
  const holds = lotHoldState(lotId);
  // Bottles and sake leave for buyers from here; the same rule the shipping step applies.
  const mayShip = ["sake", "blend", "bottled"].includes(lot.kind) && lot.onHand > 0 && canActOnLot(user, { partyId: lot.party.id }) && (can(user, "brewing:record") || can(user, "polishing:record"));
  const shipsToBuyers = correctable.some((e) => e.step === "shipping");

  return (
    <div className="space-y-8">
      <div className="flex flex-wrap items-start gap-6">
        <div className="w-full max-w-md">
          <LotCardView lot={lot} />
        </div>
        <div className="flex flex-col gap-3">
          <Link className="btn" href={`/labels?codes=${encodeURIComponent(code)}&layout=bag`}>{t("printLabel")}</Link>
          <Link className="btn-quiet" href={`/labels?codes=${encodeURIComponent(code)}`}>{t("labelSheet")}</Link>
          <Link className="btn-quiet" href={`/lots/${encodeURIComponent(code)}/graph`}>{(await getTranslations("graph"))("openGraph")}</Link>
        </div>
      </div>
      {run?.missedTarget ? (
        <p className="notice-warn" role="alert" data-testid="missed-target">
          {t("missedTarget", { target: run.targetPolishingRatioPct ?? 0, margin: run.marginPts ?? 1, achieved: run.achievedPolishingRatioPct ?? 0 })}
        </p>
      ) : null}
      <HoldSection code={code} hold={holds.hold} history={holds.history} mayRelease={canHoldLots(user)} />
      {lot.kind === "tank" ? <TankPanel tank={tankSummary(user, code)} /> : null}
      {making ? <PolishingFigures attributes={making.attributes} format={format} /> : null}
      <section className="grid gap-6 md:grid-cols-2">
        <LineageList title={t("back")} empty={t("noBack")} items={lineage.back} direction="back" testId="one-step-back" />
        <LineageList title={t("forward")} empty={t("noForward")} items={lineage.forward} direction="forward" testId="one-step-forward" />
      </section>
      <section>
        <AttachmentsPanel code={code} canUpload={files.canUpload} items={files.items} />
      </section>
      <section>
        <h2 className="mb-3 text-xl font-bold">{t("history")}</h2>
        <EventTimeline events={history} lotCode={code} />
      </section>
      {mayShip ? (
        <section className="panel max-w-2xl" aria-labelledby="ship-title">
          <h2 id="ship-title" className="text-xl font-bold">{(await getTranslations("shipments"))("title")}</h2>
          <p className="mb-2 text-sm text-ink-soft">{(await getTranslations("shipments"))("intro")}</p>
          <p className="mb-4 text-sm text-ink-soft">{(await getTranslations("shipments"))("returns")}</p>
          <ShipmentForm code={code} unit={lot.unit} onHand={lot.onHand} buyers={listParties("buyer").map((p) => ({ id: p.id, name: p.name }))} today={new Date().toISOString().slice(0, 10)} />
        </section>
      ) : null}
      {correctable.length ? (
        <section className="panel max-w-2xl">
          <h2 className="text-xl font-bold">{t("correctTitle")}</h2>
          <p className="mb-4 text-sm text-ink-soft">{t("correctIntro")}</p>
          {shipsToBuyers ? <p className="mb-4 text-sm text-ink-soft">{(await getTranslations("shipments"))("returns")}</p> : null}
          <CorrectionForm code={code} events={correctable.map((e) => ({ id: e.id, step: e.step, at: e.at }))} />
        </section>
      ) : null}
    </div>
  );
}

async function PolishingFigures({ attributes, format }: { attributes: Record<string, unknown>; format: Awaited<ReturnType<typeof getFormatter>> }) {
  const t = await getTranslations("lot");
  const pct = (v: unknown) => (typeof v === "number" ? `${format.number(roundPct(v), { maximumFractionDigits: 1 })} %` : "—");
  return (
    <dl className="grid max-w-2xl grid-cols-2 gap-3 sm:grid-cols-4" data-testid="polishing-figures">
      {[
        [t("targetRatio"), pct(attributes.targetPolishingRatioPct)],
        [t("polishingRatio"), pct(attributes.achievedPolishingRatioPct)],
        [t("trueRatio"), pct(attributes.truePolishingRatioPct)],
        [t("branYield"), pct(attributes.branYieldPct)],
      ].map(([k, v]) => (
        <div key={k} className="panel p-3">
          <dt className="text-xs font-semibold text-ink-soft">{k}</dt>
          <dd className="text-2xl font-bold">{v}</dd>
        </div>
      ))}
    </dl>
  );
}

export default withClientMessages(["attachments", "holds", "lotPage", "shipments", "steps"], LotPage);
