import { getTranslations } from "next-intl/server";

export type CautionKind = "steam" | "koji" | "tank";

/**
 * The usual cautions at the steamer, the koji room and the tank; the brewery's own rules come first.
 * One line on the phone (it is read at every step), the details a tap away.
 */
export async function Caution({ kind }: { kind: CautionKind }) {
  const t = await getTranslations("caution");
  return (
    <details role="note" data-testid={`caution-${kind}`} className="rounded-lg border-4 border-koji bg-koji-pale px-4 py-2 text-ink">
      <summary className="flex min-h-12 cursor-pointer items-center gap-2 font-bold">
        <span aria-hidden="true">⚠</span> {t(`${kind}.title`)} <span className="ml-auto text-sm font-normal underline">{t("details")}</span>
      </summary>
      <p className="mt-1 text-base">{t(`${kind}.body`)}</p>
      <p className="mt-1 pb-2 text-sm">{t("houseRules")}</p>
    </details>
  );
}
