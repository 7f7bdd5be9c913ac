import "server-only";
import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from "pdf-lib";
import { csvText } from "@/lib/validation/csv";
import { dayInJapan } from "@/lib/validation/csv";
import type { Translate } from "@/lib/validation/field-errors";
import { ascii, wrapWords } from "./pdf-text";
import { describeEntry } from "./supplier-describe";
import type { StatementView } from "./supplier-statements";

const yen = (v: number) => new Intl.NumberFormat("en-US").format(v);
const REDUCED_MARK = "*";

/** The statement's summary lines, shared by the PDF and the CSV so both name the same totals. */
export function statementSummary(s: StatementView, t: Translate): [string, number][] {
  return [
    ...s.totals.rates.flatMap((r): [string, number][] => [
      [t("suppliers.statement.subtotal", { rate: r.ratePct, mark: r.ratePct === 8 ? REDUCED_MARK : "" }), r.netYen],
      [t("suppliers.statement.tax", { rate: r.ratePct }), r.taxYen],
    ]),
    [t("suppliers.statement.totalInclTax"), s.totals.grossYen],
    [t("suppliers.statement.payments"), s.totals.paymentsYen],
    [t("suppliers.statement.adjustments"), s.totals.adjustmentsYen],
    [t("suppliers.statement.balance"), s.balanceYen],
  ];
}

export function statementCsv(s: StatementView, t: Translate): string {
  const c = (k: string) => t(`suppliers.statement.columns.${k}`);
  const rows: unknown[][] = s.entries.map((e) => [dayInJapan(e.at), t(`suppliers.kinds.${e.kind}`), describeEntry(e, t), e.lotCode ?? "", e.taxRatePct, e.amountYen]);
  for (const [label, value] of statementSummary(s, t)) rows.push(["", label, "", "", "", value]);
  return csvText([c("date"), c("entry"), c("description"), c("lot"), c("taxRatePct"), c("amountYen")], rows);
}

/** An A4 statement in the layout a purchase statement needs: who, whose number, what, per-rate totals and tax. */
export async function statementPdf(s: StatementView, t: Translate): Promise<Uint8Array> {
  const pdf = await PDFDocument.create();
  pdf.setTitle(ascii(t("suppliers.statement.title", { number: s.number })));
  pdf.setCreator("Grainline");
  const regular = await pdf.embedFont(StandardFonts.Helvetica);
  const bold = await pdf.embedFont(StandardFonts.HelveticaBold);
  const cedar = rgb(0.18, 0.36, 0.31);
  let page: PDFPage = pdf.addPage([595.28, 841.89]);
  let y = 790;
  const ensure = (space: number) => {
    if (y - space >= 56) return;
    page = pdf.addPage([595.28, 841.89]);
    y = 790;
  };
  const text = (value: string, x: number, size = 10, font: PDFFont = regular) => page.drawText(ascii(value), { x, y, size, font, color: font === bold ? cedar : undefined });
  const right = (value: string, xRight: number, size = 10, font: PDFFont = regular) => text(value, xRight - font.widthOfTextAtSize(ascii(value), size), size, font);
  const wrap = (value: string, width: number, size = 10) => wrapWords(value, regular, size, width);

  text(t("suppliers.statement.title", { number: s.number }), 56, 18, bold);
  y -= 22;
  text(t("suppliers.statement.subtitle", { issuer: s.issuer }), 56, 11);
  y -= 28;
  const head: [string, string][] = [
    [t("suppliers.statement.supplier"), s.supplier.name],
    [t("suppliers.statement.invoiceNumber"), s.supplier.invoiceNumber ?? t("suppliers.statement.notRegistered")],
    [t("suppliers.statement.period"), t("suppliers.statement.periodValue", { from: s.from, to: s.to })],
    [t("suppliers.statement.issued"), dayInJapan(s.issuedAt)],
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
  for (const e of s.entries) {
    const mark = e.taxRatePct === 8 ? ` ${REDUCED_MARK}` : "";
    const lines = wrap(describeEntry(e, t) + mark, 300, 9);
    ensure(12 * lines.length + 4);
    text(dayInJapan(e.at), 56, 9);
    right(e.taxRatePct ? `${e.taxRatePct} %` : "-", 470, 9);
    right(yen(e.amountYen), 540, 9);
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
    right(`${yen(value)} JPY`, 540, 10);
    y -= 16;
  }
  y -= 12;
  for (const note of [t("suppliers.statement.reducedNote"), t(`suppliers.statement.roundingNote.${s.totals.rounding}`), t("suppliers.statement.checkNote")]) {
    for (const line of wrap(note, 480, 9)) {
      ensure(12);
      text(line, 56, 9);
      y -= 12;
    }
    y -= 4;
  }
  return pdf.save({ useObjectStreams: false });
}
