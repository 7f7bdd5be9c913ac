import "server-only";
import { PDFDocument, StandardFonts, rgb } from "pdf-lib";
import type { Provenance } from "./provenance";

const pct = (v: number) => `${Math.round(v * 1000) / 10} %`;
// The PDF standard fonts cover WinAnsi only; anything else is written as "?" rather than failing.
const ascii = (s: string) => s.replace(/[^\x20-\x7e]/g, "?");

/** A one-page A4 provenance sheet for buyers, from the same answer the screen shows. */
export async function provenanceSheetPdf(p: Provenance, brewery: string, caution: string): Promise<Uint8Array> {
  const pdf = await PDFDocument.create();
  pdf.setTitle(`Provenance of ${p.lot.code}`);
  pdf.setCreator("Grainline");
  const page = pdf.addPage([595.28, 841.89]);
  const regular = await pdf.embedFont(StandardFonts.Helvetica);
  const bold = await pdf.embedFont(StandardFonts.HelveticaBold);
  const cedar = rgb(0.18, 0.36, 0.31);
  let y = 790;
  const line = (label: string, value: string) => {
    page.drawText(ascii(label), { x: 56, y, size: 10, font: bold, color: cedar });
    const words = ascii(value).split(" ");
    let row = "";
    for (const word of words) {
      if (regular.widthOfTextAtSize(`${row} ${word}`, 11) > 330) {
        page.drawText(row, { x: 210, y, size: 11, font: regular });
        y -= 15;
        row = word;
      } else row = row ? `${row} ${word}` : word;
    }
    page.drawText(row, { x: 210, y, size: 11, font: regular });
    y -= 24;
  };
  page.drawText(ascii(`Provenance of ${p.lot.code}`), { x: 56, y, size: 20, font: bold, color: cedar });
  y -= 22;
  page.drawText(ascii(brewery), { x: 56, y, size: 11, font: regular });
  y -= 36;
  line("Varieties", p.varieties.map((v) => `${v.name} ${pct(v.share)}`).join(", "));
  if (p.cropYears.length) line("Crop year", p.cropYears.join(", "));
  line("Rice origin", p.originStatement || "-");
  line("Growers", p.growers.map((g) => `${g.name ?? "growers not named at their request"} ${pct(g.share)}`).join(", "));
  if (p.polishingRatiosPct.length) line("Polishing ratio", p.polishingRatiosPct.map((r) => `${r} %`).join(", "));
  if (p.kojiRatioPct !== null) line("Koji rice", `${Math.round(p.kojiRatioPct * 10) / 10} % of the rice (dry basis)`);
  if (p.lot.kind !== "harvest") line("Premium categories", p.categories.length ? p.categories.join(", ") : "none");
  if (p.brewedOn.length) line("Brewed", p.brewedOn.map((d) => d.slice(0, 10)).join(", "));
  if (p.pressedOn.length) line("Pressed", p.pressedOn.map((d) => d.slice(0, 10)).join(", "));
  if (p.bottledOn.length) line("Bottled", p.bottledOn.map((d) => d.slice(0, 10)).join(", "));
  y -= 10;
  line("Note", caution);
  return pdf.save();
}
