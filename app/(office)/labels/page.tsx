import { getFormatter, getTranslations } from "next-intl/server";
import { MAX_LABEL_CODES, parseLabelCodes } from "@/domain/label-url";
import { actionOrigin } from "@/server/action";
import { buildLabelSheet, listLabelCandidates, paginateLabels, parseLabelLayout, QR_WIDTH_MM, type LabelView } from "@/server/labels";
import { requirePageUser } from "@/server/page-guard";
import { PrintButton } from "./components";
import { PageHeader } from "@/components/page-header";

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };
type Text = Awaited<ReturnType<typeof getTranslations>>;

export async function generateMetadata() {
  return { title: (await getTranslations("labels"))("title") };
}

// Sheet: 3 × 70 mm = 210 mm across and 8 × 37 mm = 296 mm down an A4 page (210 × 297 mm),
// 0.5 mm from the top edge, as that stock is cut. Bag: a 100 × 150 mm label area on its own
// A4 page. With no page margin the browser has nowhere to print its own header and footer.
const PRINT_CSS = "@page { size: A4; margin: 0; } @media print { html, body { background: #fff; } }";

export default async function LabelsPage({ searchParams }: Props) {
  const user = await requirePageUser();
  const query = await searchParams;
  const codes = parseLabelCodes(query.codes);
  const layout = parseLabelLayout(query.layout);
  const t = await getTranslations();
  const format = await getFormatter();
  const sheet = codes.length > 0 ? await buildLabelSheet(user, codes, layout, await actionOrigin()) : null;
  const candidates = listLabelCandidates(user);
  const ticked = new Set(codes);
  const typed = codes.filter((code) => !candidates.some((c) => c.code === code));
  const pages = sheet?.status === "ok" ? paginateLabels(sheet.labels, layout) : [];
  const quantity = (label: LabelView) => `${format.number(label.quantity, { maximumFractionDigits: 1 })} ${label.unit}`;

  return (
    <div className="space-y-6">
      <PageHeader title={t("labels.title")} intro={t("labels.intro")} className="print:hidden" />

      <form method="get" action="/labels" className="panel grid gap-4 print:hidden" data-testid="label-form">
        <fieldset>
          <legend className="field-label">{t("labels.recent")}</legend>
          {candidates.length === 0 ? <p className="text-ink-soft">{t("labels.noLots")}</p> : null}
          <div className="mt-2 grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
            {candidates.map((lot) => (
              <label key={lot.code} className="flex items-center gap-2">
                <input type="checkbox" name="codes" value={lot.code} defaultChecked={ticked.has(lot.code)} className="size-5" />
                <span className="code-chip">{lot.code}</span>
                <span className="truncate text-sm text-ink-soft">{[t(`lot.kinds.${lot.kind}`), lot.variety, lot.cropYear].filter(Boolean).join(" · ")}</span>
              </label>
            ))}
          </div>
        </fieldset>
        <div>
          <label htmlFor="codes" className="field-label">{t("labels.codes")}</label>
          <textarea id="codes" name="codes" rows={2} className="field-input font-[family-name:var(--font-code)]" defaultValue={typed.join(", ")} aria-describedby="codes-hint" />
          <p id="codes-hint" className="mt-1 text-sm text-ink-soft">{t("labels.codesHint", { max: MAX_LABEL_CODES })}</p>
        </div>
        <div className="flex flex-wrap items-end gap-4">
          <div>
            <label htmlFor="layout" className="field-label">{t("labels.layout")}</label>
            <select id="layout" name="layout" className="field-input" defaultValue={layout}>
              <option value="sheet">{t("labels.layouts.sheet")}</option>
              <option value="bag">{t("labels.layouts.bag")}</option>
            </select>
          </div>
          <button type="submit" className="btn-quiet">{t("labels.show")}</button>
        </div>
      </form>

      {sheet?.status === "too-many" ? (
        <p className="notice-warn print:hidden" role="alert">{t("labels.tooMany", { count: sheet.count, max: sheet.max })}</p>
      ) : null}
      {sheet?.status === "ok" && sheet.notFound.length > 0 ? (
        <p className="notice-warn print:hidden" role="alert" data-testid="labels-not-found">
          {t("labels.notFound", { codes: sheet.notFound.join(", ") })}
        </p>
      ) : null}
      {!sheet ? <p className="notice print:hidden">{t("labels.empty")}</p> : null}

      {pages.length > 0 ? (
        <div className="flex flex-wrap items-center gap-4 print:hidden">
          <PrintButton />
          <p className="font-semibold">
            {layout === "bag" ? t("labels.summaryBag", { count: pages.length }) : t("labels.summarySheet", { count: pages.flat().length, pages: pages.length })}
          </p>
          <p className="text-sm text-ink-soft">{t("labels.printHint")}</p>
        </div>
      ) : null}

      {pages.length > 0 ? (
        <div className="space-y-6 overflow-x-auto print:space-y-0 print:overflow-visible" data-testid="label-pages">
          <style>{PRINT_CSS}</style>
          {pages.map((page, i) =>
            layout === "bag" ? (
              <section key={page[0]!.code} className="break-after-page last:break-after-auto print:pt-[10mm]">
                <BagLabel label={page[0]!} t={t} quantity={quantity(page[0]!)} />
              </section>
            ) : (
              <section key={page[0]!.code} aria-label={t("labels.sheetLabel", { page: i + 1, pages: pages.length })} className="mx-auto grid h-[296mm] w-[210mm] grid-cols-[repeat(3,70mm)] grid-rows-[repeat(8,37mm)] overflow-hidden bg-white shadow-md break-after-page last:break-after-auto print:mx-0 print:h-[296.5mm] print:pt-[0.5mm] print:shadow-none">
                {page.map((label) => <SheetLabel key={label.code} label={label} t={t} quantity={quantity(label)} />)}
              </section>
            ),
          )}
        </div>
      ) : null}
    </div>
  );
}

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

function SheetLabel({ label, t, quantity }: { label: LabelView; t: Text; quantity: string }) {
  // Up to 10 characters (H26-0001) the code reads at 5 mm; the longest GS1 lot (20) wraps smaller.
  const codeSize = label.code.length > 10 ? "text-[3.2mm] break-all" : "text-[5mm]";
  return (
    <article className="flex h-[37mm] w-[70mm] items-center gap-[1mm] overflow-hidden px-[2mm] outline-1 -outline-offset-1 outline-dashed outline-husk print:outline-none" data-testid="label">
      <QrSymbol label={label} t={t} widthMm={QR_WIDTH_MM.sheet} />
      <div className="min-w-0 flex-1 space-y-[0.4mm] text-[2.6mm] leading-tight text-black">
        <p className={`mb-[1mm] font-[family-name:var(--font-code)] font-bold leading-none ${codeSize}`}>{label.code}</p>
        <p className="truncate font-semibold">{t(`lot.kinds.${label.kind}`)}</p>
        {label.variety ? <p className="truncate">{label.variety}</p> : null}
        {label.cropYear ? <p>{t("labels.cropYear", { year: label.cropYear })}</p> : null}
        <p>{quantity}</p>
        <p className="truncate">{label.holder}</p>
      </div>
    </article>
  );
}

function BagLabel({ label, t, quantity }: { label: LabelView; t: Text; quantity: string }) {
  const rows: [string, string | null][] = [
    [t("labels.kind"), t(`lot.kinds.${label.kind}`)],
    [t("labels.variety"), label.variety],
    [t("labels.cropYearCaption"), label.cropYear ? String(label.cropYear) : null],
    [t("labels.quantity"), quantity],
    [t("labels.holder"), label.holder],
  ];
  const codeSize = label.code.length > 10 ? "text-[6mm] break-all" : "text-[11mm]";
  return (
    <article className="mx-auto flex h-[150mm] w-[100mm] flex-col items-center overflow-hidden border border-dashed border-ink-soft bg-white p-[5mm] text-black shadow-md print:shadow-none" data-testid="label">
      <QrSymbol label={label} t={t} widthMm={QR_WIDTH_MM.bag} />
      <p className={`mt-[2mm] font-[family-name:var(--font-code)] font-bold leading-none ${codeSize}`}>{label.code}</p>
      <dl className="mt-[4mm] grid w-full grid-cols-[auto_1fr] gap-x-[4mm] gap-y-[1mm] text-[4.8mm] leading-snug">
        {rows.filter(([, value]) => value).map(([caption, value]) => (
          <div key={caption} className="contents">
            <dt className="font-semibold">{caption}</dt>
            <dd className="truncate">{value}</dd>
          </div>
        ))}
      </dl>
    </article>
  );
}
