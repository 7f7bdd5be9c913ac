import "server-only";
import { PDFDocument, StandardFonts, rgb } from "pdf-lib";
import type { Translate } from "@/lib/validation/field-errors";
import { ascii, wrapWords } from "./pdf-text";
import type { Provenance } from "./provenance";


/** A one-page A4 provenance sheet for buyers, from the same answer the screen shows, in the catalogue's words. */
export async function provenanceSheetPdf(p: Provenance, brewery: string, t: Translate): Promise<Uint8Array> {
  const title = t("provenance.sheetTitle", { code: p.lot.code });
  const share = (name: string, value: number) => t("provenance.share", { name, share: Math.round(value * 1000) / 10 });
  const percent = (value: number) => t("provenance.percent", { value });
  const pdf = await PDFDocument.create();
  pdf.setTitle(ascii(title));
  pdf.setCreator("Grainline");
  const page = pdf.addPage([595.28, 841.89]);
  const regular = await pdf.embedFont(StandardFonts.Helvetica);
  const bold = await pdf.embedFont(StandardFonts.HelveticaBold);
  const cedar = rgb(0.18, 0.36, 0.31);
  let y = 790;
  // A label in the left column (wrapped before the values start), its value beside it.
  const line = (label: string, value: string) => {
    const left = wrapWords(label, bold, 10, 140);
    const right = wrapWords(value, regular, 11, 330);
    left.forEach((row, i) => page.drawText(row, { x: 56, y: y - i * 13, size: 10, font: bold, color: cedar }));
    right.forEach((row, i) => page.drawText(row, { x: 210, y: y - i * 15, size: 11, font: regular }));
    y -= Math.max(left.length * 13, right.length * 15) + 9;
  };
  page.drawText(ascii(title), { x: 56, y, size: 20, font: bold, color: cedar });
  y -= 22;
  page.drawText(ascii(brewery), { x: 56, y, size: 11, font: regular });
  y -= 36;
  line(t("provenance.varieties"), p.varieties.map((v) => share(v.name, v.share)).join(", "));
  if (p.cropYears.length) line(t("provenance.cropYears"), p.cropYears.join(", "));
  line(t("provenance.origin"), p.originStatement || "-");
  line(t("provenance.growers"), p.growers.map((g) => share(g.name ?? t("provenance.unnamedGrower"), g.share)).join(", "));
  if (p.polishingRatiosPct.length) line(t("provenance.polishingRatio"), p.polishingRatiosPct.map(percent).join(", "));
  if (p.kojiRatioPct !== null) line(t("provenance.kojiRatio"), t("provenance.kojiRatioValue", { value: Math.round(p.kojiRatioPct * 10) / 10 }));
  if (p.lot.kind !== "harvest") line(t("provenance.categories"), p.categories.length ? p.categories.join(", ") : t("provenance.noCategory"));
  if (p.brewedOn.length) line(t("provenance.brewedOn"), p.brewedOn.map((d) => d.slice(0, 10)).join(", "));
  if (p.pressedOn.length) line(t("provenance.pressedOn"), p.pressedOn.map((d) => d.slice(0, 10)).join(", "));
  if (p.bottledOn.length) line(t("provenance.bottledOn"), p.bottledOn.map((d) => d.slice(0, 10)).join(", "));
  y -= 10;
  line(t("provenance.note"), t("caution.records"));
  return pdf.save();
}
