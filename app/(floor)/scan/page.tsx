import { getTranslations } from "next-intl/server";
import { floorRights } from "@/domain/floor-actions";
import { readScanText } from "@/lib/scan-text";
import { findLot } from "@/server/ledger/lots";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { findTankLotByName } from "@/server/floor/tanks";
import { ScanScreen, type ScanView } from "./components";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("floorScan"))("title") };
}

/** The brewer's home. `/scan?code=` answers the typed-code form even without JavaScript. */
async function ScanPage({ searchParams }: { searchParams: Promise<{ code?: string | string[] }> }) {
  const user = await requirePagePermission("brewing:record");
  const t = await getTranslations("floorScan");
  const raw = (await searchParams).code;
  const typed = (Array.isArray(raw) ? raw[0] : raw)?.trim() ?? "";
  const reading = typed ? readScanText(typed) : null;
  // Typed text that is no code may be a tank's name: the tank lot it holds now.
  const lot = reading ? findLot(user, reading.code) : typed ? findTankLotByName(user, typed) : null;
  const initial: ScanView = !typed
    ? { state: "idle" }
    : lot
      ? { state: "lot", lot }
      : !reading
        ? { state: "not-ours", text: typed.slice(0, 80) }
        : { state: "not-found", code: reading.code };
  return (
    <div className="space-y-6">
      <header>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="opacity-80">{t("intro")}</p>
      </header>
      <ScanScreen userId={user.id} rights={floorRights(user)} initial={initial} typed={lot?.code ?? reading?.code ?? typed} />
    </div>
  );
}

export default withClientMessages(["floorForms", "floorScan", "holds", "lot"], ScanPage);
