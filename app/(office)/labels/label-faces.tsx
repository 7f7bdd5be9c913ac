import type { getTranslations } from "next-intl/server";
import { printedRatioPct, QR_WIDTH_MM, type LabelView } from "@/server/floor/labels";

type Text = Awaited<ReturnType<typeof getTranslations>>;
type Props = { label: LabelView; t: Text; quantity: string };

function QrSymbol({ label, t, widthMm }: { label: LabelView; t: Text; widthMm: number }) {
  // The SVG is qrcode's own output for our URL: rectangles only, no text from the user.
  return (
    <div
      role="img"
      aria-label={t("labels.qrLabel", { code: label.code, url: label.url })}
      data-error-correction={label.errorCorrection}
      className="shrink-0 bg-white [&>svg]:block [&>svg]:size-full"
      style={{ width: `${widthMm}mm`, height: `${widthMm}mm` }}
      dangerouslySetInnerHTML={{ __html: label.svg }}
    />
  );
}

/** What a label says beside its code; polished rice adds its polishing ratio and the mill, as the trade prints on the bag. */
function facts(label: LabelView, t: Text, quantity: string): [string, string | null][] {
  return [
    [t("labels.kind"), t(`lot.kinds.${label.kind}`)],
    [t("labels.variety"), label.variety],
    [t("labels.polishingRatio"), label.polishingRatioPct != null ? `${printedRatioPct(label.polishingRatioPct)} %` : null],
    [t("labels.mill"), label.mill],
    [t("labels.cropYearCaption"), label.cropYear ? String(label.cropYear) : null],
    [t("labels.quantity"), quantity],
    [t("labels.holder"), label.holder],
  ];
}

export function SheetLabel({ label, t, quantity }: Props) {
  // Up to 10 characters (H26-0001) the code reads at 5 mm; the longest GS1 lot (20) wraps smaller.
  const codeSize = label.code.length > 10 ? "text-[3.2mm] break-all" : "text-[5mm]";
  const polished = label.polishingRatioPct != null ? t("labels.polishedLine", { ratio: printedRatioPct(label.polishingRatioPct), mill: label.mill ?? "" }) : null;
  return (
    <article className="flex h-[37mm] w-[70mm] items-center gap-[1mm] overflow-hidden px-[2mm] outline-1 -outline-offset-1 outline-dashed outline-husk print:outline-none" data-testid="label">
      <QrSymbol label={label} t={t} widthMm={QR_WIDTH_MM.sheet} />
      <div className="min-w-0 flex-1 space-y-[0.4mm] text-[2.6mm] leading-tight text-black">
        <p className={`mb-[1mm] font-[family-name:var(--font-code)] font-bold leading-none ${codeSize}`}>{label.code}</p>
        <p className="truncate font-semibold">{t(`lot.kinds.${label.kind}`)}</p>
        {label.variety ? <p className="truncate">{label.variety}</p> : null}
        {polished ? <p className="truncate" data-testid="label-polished">{polished}</p> : null}
        {label.cropYear ? <p>{t("labels.cropYear", { year: label.cropYear })}</p> : null}
        <p>{quantity}</p>
        <p className="truncate">{label.holder}</p>
      </div>
    </article>
  );
}

/** A bag label (100 × 150 mm) or a roll label (62 × 100 mm): the page is the label, nothing around it. */
export function BagLabel({ label, t, quantity, layout }: Props & { layout: "bag" | "roll" }) {
  const bag = layout === "bag";
  const codeSize = label.code.length > 10 ? (bag ? "text-[6mm]" : "text-[4mm]") + " break-all" : bag ? "text-[11mm]" : "text-[7mm]";
  return (
    <article
      className={`mx-auto flex flex-col items-center overflow-hidden bg-white text-black shadow-md outline-1 -outline-offset-1 outline-dashed outline-ink-soft print:mx-0 print:shadow-none print:outline-none ${bag ? "h-[150mm] w-[100mm] p-[5mm]" : "h-[100mm] w-[62mm] p-[3mm]"}`}
      data-testid="label"
    >
      <QrSymbol label={label} t={t} widthMm={QR_WIDTH_MM[layout]} />
      <p className={`mt-[2mm] font-[family-name:var(--font-code)] font-bold leading-none ${codeSize}`}>{label.code}</p>
      <dl className={`mt-[3mm] grid w-full grid-cols-[auto_1fr] gap-y-[0.6mm] leading-snug ${bag ? "gap-x-[4mm] text-[4.6mm]" : "gap-x-[2mm] text-[3mm]"}`}>
        {facts(label, t, quantity).filter(([, value]) => value).map(([caption, value]) => (
          <div key={caption} className="contents">
            <dt className="font-semibold">{caption}</dt>
            <dd className="truncate">{value}</dd>
          </div>
        ))}
      </dl>
    </article>
  );
}
