import { getTranslations } from "next-intl/server";

export type CautionKind = "steam" | "koji" | "tank";

/** The usual cautions at the steamer, the koji room and the tank; the brewery's own rules come first. */
export async function Caution({ kind }: { kind: CautionKind }) {
  const t = await getTranslations("caution");
  return (
    <aside role="note" data-testid={`caution-${kind}`} className="rounded-lg border-4 border-koji bg-koji-pale p-4 text-ink">
      <p className="font-bold">⚠ {t(`${kind}.title`)}</p>
      <p className="mt-1 text-base">{t(`${kind}.body`)}</p>
      <p className="mt-1 text-sm">{t("houseRules")}</p>
    </aside>
  );
}
