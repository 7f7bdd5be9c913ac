import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { ProvenanceCard } from "@/components/provenance-card";
import { LanguageSwitch } from "@/components/language-switch";
import { AppError } from "@/server/platform/errors";
import { getDb } from "@/server/platform/db";
import { listParties } from "@/server/ledger/parties";
import { publicProvenance } from "@/server/trace/provenance";
import { readSetting } from "@/server/platform/settings";
import { setLanguageAction } from "../../../../../(auth)/language/actions";

type Params = { gtin: string; lot: string };

function load({ gtin, lot }: Params) {
  if (!/^\d{8,14}$/.test(gtin)) return null;
  try {
    return publicProvenance(gtin.padStart(14, "0"), decodeURIComponent(lot).toUpperCase());
  } catch (error) {
    if (error instanceof AppError && error.code === "not_found") return null;
    throw error;
  }
}

export async function generateMetadata({ params }: { params: Promise<Params> }) {
  const t = await getTranslations("provenance");
  return { title: t("publicTitle"), robots: { index: false } };
}

/** The bottle's page (GS1 Digital Link /01/{gtin}/10/{lot}): only what the brewery made public. */
export default async function BottlePage({ params }: { params: Promise<Params> }) {
  const p = await params;
  const found = load(p);
  if (!found) notFound();
  const t = await getTranslations("provenance");
  const show = readSetting(getDb(), "publicProvenance");
  const brewery = listParties("brewery")[0]?.name ?? "";
  return (
    <article className="space-y-5" data-testid="public-bottle">
      <div className="flex justify-end">
        <LanguageSwitch action={setLanguageAction} />
      </div>
      <header>
        <p className="text-sm font-semibold text-cedar">{t("by", { brewery })}</p>
        <h1 className="text-3xl font-bold">{t("publicTitle")}</h1>
        <p className="text-ink-soft">{t("publicIntro")}</p>
        <p className="mt-2 text-sm">
          {t("lot")} <span className="code-chip">{found.bottling.code}</span> · {t("bottle")} {found.bottling.bottleMl} mL
        </p>
      </header>
      {/* Koji ratio and every internal figure stay off the public page; growers only by consent. */}
      <ProvenanceCard p={found.provenance} show={{ ...show, koji: false }} />
    </article>
  );
}
