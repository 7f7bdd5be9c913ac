import "server-only";
import { PDFDocument, rgb, type PDFFont, type PDFPage } from "pdf-lib";
import { dayIn, formatDay } from "@/i18n/dates";
import type { Locale } from "@/i18n/locale";
import { csvText } from "@/lib/validation/csv";
import type { Translate } from "@/lib/validation/field-errors";
import { embedDocumentFonts } from "../platform/pdf-fonts";
import { wrapText } from "../platform/pdf-text";
import { describeEntry } from "./supplier-describe";
import type { StatementView } from "./supplier-statements";

/** The language a document is written in: its catalogue, its locale's numbers and dates, the brewery's clock. */
export type DocumentLanguage = { t: Translate; locale: Locale; timeZone: string };

/** The statement's summary lines, shared by the PDF and the CSV so both name the same totals. */
export function statementSummary(s: StatementView, t: Translate): [string, number][] {
  const mark = t("suppliers.statement.reducedMark");
  return [
    ...s.totals.rates.flatMap((r): [string, number][] => [
      [t("suppliers.statement.subtotal", { rate: r.ratePct, mark: r.ratePct === 8 ? mark : "" }), r.netYen],
      [t("suppliers.statement.tax", { rate: r.ratePct }), r.taxYen],
    ]),
    [t("suppliers.statement.totalInclTax"), s.totals.grossYen],
    [t("suppliers.statement.payments"), s.totals.paymentsYen],
    [t("suppliers.statement.adjustments"), s.totals.adjustmentsYen],
    [t("suppliers.statement.balance"), s.balanceYen],
  ];
}

export function statementCsv(s: StatementView, t: Translate, timeZone: string): string {
  const c = (k: string) => t(`suppliers.statement.columns.${k}`);
  const rows: unknown[][] = s.entries.map((e) => [dayIn(e.at, timeZone), t(`suppliers.kinds.${e.kind}`), describeEntry(e, t), e.lotCode ?? "", e.taxRatePct, e.amountYen]);
  for (const [label, value] of statementSummary(s, t)) rows.push(["", label, "", "", "", value]);
  return csvText([c("date"), c("entry"), c("description"), c("lot"), c("taxRatePct"), c("amountYen")], rows);
}

/** Lines under the totals: the reduced-rate mark, the rounding, whether it can be a qualified invoice, and the request to confirm. */
function statementNotes(s: StatementView, t: Translate): string[] {
  return [
    t("suppliers.statement.reducedNote"),
    t(`suppliers.statement.roundingNote.${s.totals.rounding}`),
    ...(s.supplier.invoiceNumber ? [] : [t("suppliers.statement.notQualifiedNote")]),
    t("suppliers.statement.checkNote"),
  ];
}

/**
 * An A4 statement in the layout of a buyer-made purchase statement (仕入明細書) under the
 * qualified invoice system: who made it, the supplier and the supplier's registration number,
 * each transaction's date and what was supplied (reduced-rate lines marked), the net and the
 * tax per rate, and the request that the supplier confirm it.
 */
export async function statementPdf(s: StatementView, { t, locale, timeZone }: DocumentLanguage): Promise<Uint8Array> {
  const pdf = await PDFDocument.create();
  pdf.setTitle(t("suppliers.statement.title", { number: s.number }));
  pdf.setCreator("Grainline");
  pdf.setLanguage(locale);
  const { regular, bold } = await embedDocumentFonts(pdf);
  const cedar = rgb(0.18, 0.36, 0.31);
  const number = new Intl.NumberFormat(locale);
  const yen = (v: number) => t("suppliers.statement.amount", { amount: number.format(v) });
  const day = (at: Date | string) => formatDay(at, locale, timeZone);
  let page: PDFPage = pdf.addPage([595.28, 841.89]);
  let y = 790;
  const ensure = (space: number) => {
    if (y - space >= 56) return;
    page = pdf.addPage([595.28, 841.89]);
    y = 790;
  };
  const text = (value: string, x: number, size = 10, font: PDFFont = regular) => page.drawText(value, { x, y, size, font, color: font === bold ? cedar : undefined });
  const right = (value: string, xRight: number, size = 10, font: PDFFont = regular) => text(value, xRight - font.widthOfTextAtSize(value, size), size, font);

  text(t("suppliers.statement.title", { number: s.number }), 56, 18, bold);
  y -= 22;
  text(t("suppliers.statement.subtitle", { issuer: s.issuer }), 56, 11);
  y -= 28;
  const head: [string, string][] = [
    [t("suppliers.statement.maker"), s.issuer],
    [t("suppliers.statement.supplier"), s.supplier.name],
    [t("suppliers.statement.invoiceNumber"), s.supplier.invoiceNumber ?? t("suppliers.statement.notRegistered")],
    [t("suppliers.statement.period"), t("suppliers.statement.periodValue", { from: day(s.from), to: day(s.to) })],
    [t("suppliers.statement.issued"), day(s.issuedAt)],
  ];
  for (const [label, value] of head) {
    text(label, 56, 10, bold);
    text(value, 210, 10);
    y -= 15;
  }
  y -= 12;
  text(t("suppliers.statement.columns.date"), 56, 9, bold);
  text(t("suppliers.statement.columns.description"), 130, 9, bold);
  right(t("suppliers.statement.columns.taxRatePct"), 470, 9, bold);
  right(t("suppliers.statement.columns.amountYen"), 540, 9, bold);
  y -= 16;
  const mark = t("suppliers.statement.reducedMark");
  for (const e of s.entries) {
    const lines = wrapText(describeEntry(e, t) + (e.taxRatePct === 8 ? ` ${mark}` : ""), regular, 9, 290);
    ensure(12 * lines.length + 4);
    text(day(e.at), 56, 9);
    right(e.taxRatePct ? `${e.taxRatePct} %` : "-", 470, 9);
    right(number.format(e.amountYen), 540, 9);
    for (const line of lines) {
      text(line, 130, 9);
      y -= 12;
    }
    y -= 4;
  }
  y -= 10;
  for (const [label, value] of statementSummary(s, t)) {
    ensure(16);
    text(label, 300, 10, bold);
    right(yen(value), 540, 10);
    y -= 16;
  }
  y -= 12;
  for (const note of statementNotes(s, t)) {
    for (const line of wrapText(note, regular, 9, 480)) {
      ensure(12);
      text(line, 56, 9);
      y -= 12;
    }
    y -= 4;
  }
  return pdf.save({ useObjectStreams: false });
}
