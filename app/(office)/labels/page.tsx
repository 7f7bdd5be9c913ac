import { getTranslations } from "next-intl/server";
import { MAX_LABEL_CODES, parseLabelCodes } from "@/domain/label-url";
import { actionOrigin } from "@/server/platform/action";
import { buildLabelSheet, expandCopies, LABEL_LAYOUTS, listLabelCandidates, MAX_COPIES, PAGE_SIZE, paginateLabels, parseCopies, parseLabelLayout, type LabelLayout, type LabelView } from "@/server/floor/labels";
import { requirePageUser } from "@/server/accounts/page-guard";
import { PrintButton } from "./components";
import { BagLabel, SheetLabel } from "./label-faces";
import { PageHeader } from "@/components/page-header";
import { getQuantity } from "@/lib/get-quantity";
import { withClientMessages } from "@/i18n/client-messages";

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

export async function generateMetadata() {
  return { title: (await getTranslations("labels"))("title") };
}

// Sheet: 3 × 70 mm = 210 mm across and 8 × 37 mm = 296 mm down an A4 page (210 × 297 mm),
// 0.5 mm from the top edge, as that stock is cut. Bag and roll: the page is the label
// (100 × 150 mm, 62 × 100 mm). With no page margin the browser has nowhere to print its own
// header and footer.
const printCss = (layout: LabelLayout) => `@page { size: ${PAGE_SIZE[layout]}; margin: 0; } @media print { html, body { background: #fff; } }`;

async function LabelsPage({ searchParams }: Props) {
  const user = await requirePageUser();
  const query = await searchParams;
  const codes = parseLabelCodes(query.codes);
  const layout = parseLabelLayout(query.layout);
  const copies = parseCopies(query.copies);
  const t = await getTranslations();
  const sheet = codes.length > 0 ? await buildLabelSheet(user, codes, layout, await actionOrigin(), copies) : null;
  const candidates = listLabelCandidates(user);
  const ticked = new Set(codes);
  const typed = codes.filter((code) => !candidates.some((c) => c.code === code));
  const pages = sheet?.status === "ok" ? paginateLabels(expandCopies(sheet.labels), layout) : [];
  const amount = await getQuantity();
  const quantity = (label: LabelView) => amount(label.quantity, label.unit);

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
              {LABEL_LAYOUTS.map((l) => <option key={l} value={l}>{t(`labels.layouts.${l}`)}</option>)}
            </select>
          </div>
          <div>
            <label htmlFor="copies" className="field-label">{t("labels.copies")}</label>
            <input id="copies" name="copies" inputMode="numeric" className="field-input w-32" defaultValue={copies ?? ""} aria-describedby="copies-hint" />
            <p id="copies-hint" className="mt-1 max-w-sm text-sm text-ink-soft">{t("labels.copiesHint", { max: MAX_COPIES })}</p>
          </div>
          <button type="submit" className="btn-quiet">{t("labels.show")}</button>
        </div>
      </form>

      {sheet?.status === "too-many" ? (
        <p className="notice-warn print:hidden" role="alert">{t("labels.tooMany", { count: sheet.count, max: sheet.max })}</p>
      ) : null}
      {sheet?.status === "too-many-labels" ? (
        <p className="notice-warn print:hidden" role="alert">{t("labels.tooManyLabels", { count: sheet.count, max: sheet.max })}</p>
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
            {layout === "sheet" ? t("labels.summarySheet", { count: pages.flat().length, pages: pages.length }) : t("labels.summaryBag", { count: pages.length })}
          </p>
          {sheet?.status === "ok" ? <BagCounts labels={sheet.labels} t={t} /> : null}
          <p className="text-sm text-ink-soft">{t("labels.printHint")}</p>
        </div>
      ) : null}

      {pages.length > 0 ? (
        <div className="space-y-6 overflow-x-auto print:space-y-0 print:overflow-visible" data-testid="label-pages">
          <style>{printCss(layout)}</style>
          {pages.map((page, i) =>
            layout !== "sheet" ? (
              <section key={i} className="break-after-page last:break-after-auto">
                <BagLabel label={page[0]!} t={t} quantity={quantity(page[0]!)} layout={layout} />
              </section>
            ) : (
              <section key={i} aria-label={t("labels.sheetLabel", { page: i + 1, pages: pages.length })} className="mx-auto grid h-[296mm] w-[210mm] grid-cols-[repeat(3,70mm)] grid-rows-[repeat(8,37mm)] overflow-hidden bg-white shadow-md break-after-page last:break-after-auto print:mx-0 print:h-[296.5mm] print:pt-[0.5mm] print:shadow-none">
                {page.map((label, n) => <SheetLabel key={n} label={label} t={t} quantity={quantity(label)} />)}
              </section>
            ),
          )}
        </div>
      ) : null}
    </div>
  );
}

/** How many labels each lot gets, and why: its bags as recorded, 30 kg bags worked out, or the copies asked for. */
function BagCounts({ labels, t }: { labels: LabelView[]; t: Awaited<ReturnType<typeof getTranslations>> }) {
  return (
    <ul className="w-full text-sm text-ink-soft" data-testid="label-copies">
      {labels.map((l) => <li key={l.code}>{t(`labels.copiesFrom.${l.bags}`, { code: l.code, count: l.copies })}</li>)}
    </ul>
  );
}

export default withClientMessages(["labels"], LabelsPage);
