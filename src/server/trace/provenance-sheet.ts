import "server-only";
import { PDFDocument, rgb } from "pdf-lib";
import { originStatementIn } from "@/domain/origin";
import { daysShown, formatDay } from "@/i18n/dates";
import { embedDocumentFonts } from "../platform/pdf-fonts";
import { wrapText } from "../platform/pdf-text";
import type { Provenance } from "./provenance";
import type { DocumentLanguage } from "../suppliers/supplier-statement-files";

/**
 * A one-page A4 provenance sheet for buyers, from the same answer the screen shows, in the
 * reader's language: the catalogue's words, the locale's numbers, and days on the brewery's clock
 * (a bottling at 07:00 in Tokyo is that Tokyo day, not the UTC day before).
 */
export async function provenanceSheetPdf(p: Provenance, brewery: string, { t, locale, timeZone }: DocumentLanguage): Promise<Uint8Array> {
  const title = t("provenance.sheetTitle", { code: p.lot.code });
  const list = locale === "ja" ? "、" : ", ";
  const share = (name: string, value: number) => t("provenance.share", { name, share: Math.round(value * 1000) / 10 });
  const percent = (value: number) => t("provenance.percent", { value });
  const day = (iso: string) => formatDay(iso, locale, timeZone);
  const days = (isos: string[]) => {
    const shown = daysShown(isos, timeZone);
    return "days" in shown ? shown.days.map(day).join(list) : t("provenance.daysBetween", { first: day(shown.first), last: day(shown.last), count: shown.count });
  };
  const pdf = await PDFDocument.create();
  pdf.setTitle(title);
  pdf.setCreator("Grainline");
  pdf.setLanguage(locale);
  const page = pdf.addPage([595.28, 841.89]);
  const { regular, bold } = await embedDocumentFonts(pdf);
  const cedar = rgb(0.18, 0.36, 0.31);
  let y = 790;
  // A label in the left column (wrapped before the values start), its value beside it.
  const line = (label: string, value: string) => {
    const left = wrapText(label, bold, 10, 140);
    const right = wrapText(value, regular, 11, 330);
    left.forEach((row, i) => page.drawText(row, { x: 56, y: y - i * 13, size: 10, font: bold, color: cedar }));
    right.forEach((row, i) => page.drawText(row, { x: 210, y: y - i * 15, size: 11, font: regular }));
    y -= Math.max(left.length * 13, right.length * 15) + 9;
  };
  page.drawText(title, { x: 56, y, size: 20, font: bold, color: cedar });
  y -= 22;
  page.drawText(brewery, { x: 56, y, size: 11, font: regular });
  y -= 36;
  line(t("provenance.varieties"), p.varieties.map((v) => share(v.name, v.share)).join(list));
  if (p.cropYears.length) line(t("provenance.cropYears"), p.cropYears.join(list));
  line(t("provenance.origin"), originStatementIn(p.origins, locale) || "-");
  line(t("provenance.growers"), p.growers.map((g) => share(g.name ?? t("provenance.unnamedGrower"), g.share)).join(list));
  if (p.polishingRatiosPct.length) line(t("provenance.polishingRatio"), p.polishingRatiosPct.map(percent).join(list));
  if (p.kojiRatioPct !== null) line(t("provenance.kojiRatio"), t("provenance.kojiRatioValue", { value: Math.round(p.kojiRatioPct * 10) / 10 }));
  if (p.lot.kind !== "harvest") line(t("provenance.categories"), p.categories.length ? p.categories.join(list) : t("provenance.noCategory"));
  if (p.brewedOn.length) line(t("provenance.brewedOn"), days(p.brewedOn));
  if (p.pressedOn.length) line(t("provenance.pressedOn"), days(p.pressedOn));
  if (p.bottledOn.length) line(t("provenance.bottledOn"), days(p.bottledOn));
  y -= 10;
  line(t("provenance.note"), t("caution.records"));
  return pdf.save();
}
