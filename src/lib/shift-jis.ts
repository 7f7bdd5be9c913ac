import Papa from "papaparse";

/**
 * Shift_JIS (CP932) in the browser, where TextEncoder writes only UTF-8 (WHATWG Encoding
 * Standard, "TextEncoder"). The table is the WHATWG decoder's own, read back: every single byte
 * and every lead/trail pair it decodes (encoding.spec.whatwg.org, "Shift_JIS decoder": lead
 * 0x81–0x9F and 0xE0–0xFC, trail 0x40–0x7E and 0x80–0xFC). Built once, on the first download.
 */
let encoder: Map<string, number[]> | null = null;

function decodes(bytes: number[]): string | null {
  try {
    return new TextDecoder("shift_jis", { fatal: true }).decode(new Uint8Array(bytes));
  } catch {
    return null;
  }
}

/**
 * Rows 89–92 (lead 0xED, 0xEE) repeat the IBM extensions of 0xFA–0xFC; the WHATWG encoder
 * leaves pointers 8272–8835 out ("index Shift_JIS pointer"), so the IBM codes are written.
 */
function necSelectedIbm(lead: number, trail: number): boolean {
  const pointer = (lead - (lead < 0xa0 ? 0x81 : 0xc1)) * 188 + trail - (trail < 0x7f ? 0x40 : 0x41);
  return pointer >= 8272 && pointer <= 8835;
}

function table(): Map<string, number[]> {
  if (encoder) return encoder;
  encoder = new Map();
  const keep = (bytes: number[]) => {
    const char = decodes(bytes);
    // A character with two codes (NEC and IBM rows hold some twice) keeps the first; both read back the same.
    if (char !== null && [...char].length === 1 && !encoder!.has(char)) encoder!.set(char, bytes);
  };
  for (let b = 0; b <= 0xdf; b += 1) if (b < 0x80 || b >= 0xa1) keep([b]);
  for (let lead = 0x81; lead <= 0xfc; lead += 1) {
    if (lead > 0x9f && lead < 0xe0) continue;
    for (let trail = 0x40; trail <= 0xfc; trail += 1) if (trail !== 0x7f && !necSelectedIbm(lead, trail)) keep([lead, trail]);
  }
  return encoder;
}

export const fitsShiftJis = (text: string) => [...text].every((ch) => table().has(ch));

/** The bytes of `text` in Shift_JIS, or null when a character has no code there. */
export function encodeShiftJis(text: string): Uint8Array<ArrayBuffer> | null {
  const codes = table();
  const out: number[] = [];
  for (const ch of text) {
    const bytes = codes.get(ch);
    if (!bytes) return null;
    out.push(...bytes);
  }
  return Uint8Array.from(out);
}

export type Misfit = { row: number; column: string; value: string };

/**
 * The first CSV cell that `fits` refuses, as a spreadsheet numbers it (the header is row 1)
 * and by its column's header, with the character at fault — what the person fixes or avoids.
 */
export function firstMisfitCell(csv: string, fits: (text: string) => boolean): Misfit | null {
  const rows = Papa.parse<string[]>(csv.replace(/^\uFEFF/, ""), { skipEmptyLines: false }).data;
  for (const [r, cells] of rows.entries()) {
    for (const [c, cell] of cells.entries()) {
      if (fits(cell)) continue;
      return { row: r + 1, column: rows[0]?.[c] ?? String(c + 1), value: [...cell].find((ch) => !fits(ch)) ?? cell };
    }
  }
  return null;
}
