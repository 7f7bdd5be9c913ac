import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";

/**
 * The text a PDF shows, read by Mozilla's pdf.js (pdfjs-dist, an independent reader): each
 * page's text items in drawing order, one item a line, empty items left out. Unlike
 * pdf-text.ts it reads embedded CID fonts (Japanese) through their ToUnicode maps (ISO 32000-1 §9.10).
 */
export async function readPdfText(bytes: Uint8Array): Promise<string> {
  const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  const lines: string[] = [];
  for (let n = 1; n <= doc.numPages; n++) {
    const content = await (await doc.getPage(n)).getTextContent();
    for (const item of content.items) if ("str" in item && item.str.trim()) lines.push(item.str);
  }
  await doc.destroy();
  return lines.join("\n");
}
