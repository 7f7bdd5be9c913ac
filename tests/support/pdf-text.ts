import { inflateSync } from "node:zlib";

/**
 * The text a PDF draws, read roughly: every content stream is inflated (FlateDecode, RFC 1950)
 * and the strings shown with Tj are decoded — hex strings as pdf-lib writes them for the
 * standard fonts (ISO 32000-1 §7.3.4.3), literal strings as other writers do. One string a line.
 */
export function pdfText(bytes: Uint8Array): string {
  const buffer = Buffer.from(bytes);
  if (buffer.subarray(0, 5).toString("latin1") !== "%PDF-") throw new Error("not a PDF");
  const raw = buffer.toString("latin1");
  const out: string[] = [];
  const streams = /stream\r?\n/g;
  let match: RegExpExecArray | null;
  while ((match = streams.exec(raw))) {
    const start = match.index + match[0].length;
    const end = raw.indexOf("endstream", start);
    if (end < 0) break;
    const body = buffer.subarray(start, end);
    let content: string;
    try {
      content = inflateSync(body).toString("latin1");
    } catch {
      content = body.toString("latin1");
    }
    for (const m of content.matchAll(/<([0-9A-Fa-f\s]*)>\s*Tj|\(((?:\\.|[^\\)])*)\)\s*Tj/g)) {
      out.push(m[1] !== undefined ? Buffer.from(m[1].replace(/\s/g, ""), "hex").toString("latin1") : m[2]!.replace(/\\(.)/g, "$1"));
    }
    streams.lastIndex = end;
  }
  return out.join("\n");
}
