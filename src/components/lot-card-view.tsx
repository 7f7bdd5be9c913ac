import { getFormatter, getTranslations } from "next-intl/server";
import { getQuantity } from "@/lib/get-quantity";
import type { ApiLot } from "@/server/ledger/lots";

export async function LotCardView({ lot, dark }: { lot: ApiLot; dark?: boolean }) {
  const t = await getTranslations("lot");
  const format = await getFormatter();
  const amount = await getQuantity();
  const rows: [string, string | null][] = [
    [t("kind"), t(`kinds.${lot.kind}`)],
    [t("onHand"), amount(lot.onHand, lot.unit, 1)],
    [t("variety"), lot.variety ?? null],
    // A polished mix keeps each variety with its share of the rice.
    [t("varieties"), varietiesOf(lot, (n) => format.number(n, { style: "percent", maximumFractionDigits: 1 }))],
    [t("tank"), typeof lot.attributes.tankName === "string" ? lot.attributes.tankName : null],
    [t("cropYear"), lot.cropYear ? String(lot.cropYear) : null],
    [t("grade"), lot.grade ? t(`grades.${lot.grade}`) : null],
    [t("polishingRatio"), lot.polishingRatioPct != null ? `${format.number(lot.polishingRatioPct, { maximumFractionDigits: 1 })} %` : null],
    [t("holder"), lot.party.name],
    [t("field"), lot.field ? `${lot.field.name} (${lot.field.region})` : null],
    [t("received"), format.dateTime(new Date(lot.createdAt), "day")],
  ];
  return (
    <article data-testid="lot-card" className={`rounded-xl border-4 p-5 ${dark ? "border-koji bg-cedar-deep text-paper" : "border-husk bg-white"}`}>
      <p className="code-chip text-xl text-ink">{lot.code}</p>
      <dl className="mt-4 grid grid-cols-[auto_1fr] gap-x-5 gap-y-2">
        {rows.filter(([, v]) => v).map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="font-semibold opacity-80">{k}</dt>
            <dd className="font-semibold">{v}</dd>
          </div>
        ))}
      </dl>
    </article>
  );
}

function varietiesOf(lot: ApiLot, pct: (n: number) => string): string | null {
  const mix = lot.attributes.varieties as { variety: string; share: number }[] | undefined;
  return Array.isArray(mix) && mix.length > 1 ? mix.map((v) => `${v.variety} ${pct(v.share)}`).join(", ") : null;
}
