import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { Caution, type CautionKind } from "@/components/caution";
import { FLOOR_ACTIONS, floorOffer, type FloorAction } from "@/domain/floor-actions";
import { normaliseLotCode } from "@/domain/lot-code";
import { getDb } from "@/server/platform/db";
import { findLot } from "@/server/ledger/lots";
import { listProducts } from "@/server/ledger/products";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { readSetting } from "@/server/platform/settings";
import { freeTanks } from "@/server/floor/tank-register";
import { FloorActionForm } from "./components";
import { FloorLink } from "@/components/floor/floor-link";
import { withClientMessages } from "@/i18n/client-messages";

const CAUTIONS: Partial<Record<FloorAction, CautionKind>> = { steam: "steam", split: "steam", "koji-check": "koji", koji: "koji", add: "tank", measure: "tank", press: "tank" };

export async function generateMetadata({ params }: { params: Promise<{ action: string }> }) {
  const { action } = await params;
  const t = await getTranslations("floorForms");
  return { title: FLOOR_ACTIONS.includes(action as FloorAction) ? t(`${action}.title`) : "404" };
}

async function FloorActionPage({ params, searchParams }: { params: Promise<{ action: string }>; searchParams: Promise<{ lot?: string; queued?: string }> }) {
  const user = await requirePagePermission("brewing:record");
  const { action } = await params;
  if (!FLOOR_ACTIONS.includes(action as FloorAction)) notFound();
  const t = await getTranslations();
  const query = await searchParams;
  const code = normaliseLotCode(query.lot ?? "");
  const lot = code ? findLot(user, code) : null;
  const caution = CAUTIONS[action as FloorAction];
  // A lot the party does not hold, or one on its way elsewhere, gets no form: where it is instead.
  const offer = lot ? floorOffer(user, lot) : null;
  const db = getDb();
  const bands = { absorption: readSetting(db, "absorptionBands"), gain: readSetting(db, "steamGainBands"), koji: readSetting(db, "kojiBands") };
  return (
    <div className="space-y-5">
      <p><FloorLink href={code ? `/scan?code=${code}` : "/scan"} className="text-paper">← {t("floorForms.back")}</FloorLink></p>
      <h1 className="text-3xl font-bold">{t(`floorForms.${action}.title`)}</h1>
      {caution ? <Caution kind={caution} /> : null}
      {offer && offer.state !== "actions" ? (
        <p role="alert" className="notice-warn text-ink" data-testid="lot-whereabouts">
          {offer.state === "in-transit" ? t("floorScan.card.inTransit", { party: offer.to }) : t("floorScan.card.heldBy", { party: offer.by })}
        </p>
      ) : lot ? (
        <FloorActionForm action={action as FloorAction} lot={lot} bands={bands} userId={user.id} queuedId={typeof query.queued === "string" ? query.queued : undefined} tanks={action === "add" ? freeTanks() : []} products={action === "bottle" ? listProducts() : []} />
      ) : (
        <p role="alert" className="notice-warn text-ink">{code ? t("lookup.notFound", { code }) : t("floorForms.scanFirst")}</p>
      )}
    </div>
  );
}

export default withClientMessages(["floorForms", "floorScan", "lot", "validation"], FloorActionPage);
