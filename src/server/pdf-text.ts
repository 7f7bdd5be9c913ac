import "server-only";
import type { PDFFont } from "pdf-lib";

/** The PDF standard fonts cover WinAnsi only; anything else is written as "?" rather than failing. */
export const ascii = (s: string) => s.replace(/[^\x20-\x7e]/g, "?");

/** `text` (made ascii) in rows of whole words, none wider than `width` at this font and size. */
export function wrapWords(text: string, font: PDFFont, size: number, width: number): string[] {
  const rows: string[] = [];
  let row = "";
  for (const word of ascii(text).split(" ")) {
    if (row && font.widthOfTextAtSize(`${row} ${word}`, size) > width) {
      rows.push(row);
      row = word;
    } else row = row ? `${row} ${word}` : word;
  }
  return [...rows, row];
}
