/**
 * Which text a CSV file's bytes hold. Spreadsheets in Japan save CSV either as UTF-8 (with a
 * byte-order mark: Excel's "CSV UTF-8") or as Shift_JIS — in practice Windows-31J/CP932, which
 * is what the WHATWG Encoding Standard's "shift_jis" decoder reads (encoding.spec.whatwg.org,
 * "Shift_JIS", index jis0208 with the NEC and IBM extensions). Runs in the browser and in Node:
 * TextDecoder only.
 */
export const CSV_ENCODINGS = ["UTF-8", "Shift_JIS"] as const;
export type CsvEncoding = (typeof CSV_ENCODINGS)[number];

export type DecodedCsv =
  | { ok: true; encoding: CsvEncoding; text: string }
  | { ok: false; reason: "undecodable" }
  | { ok: false; reason: "replacement" | "control"; line: number };

const BOM = [0xef, 0xbb, 0xbf];

/**
 * Characters no spreadsheet cell holds: C0 controls other than TAB, LF and CR, DEL, and C1
 * controls (Unicode, "Cc" general category). A byte that decodes to one is a sign the guess of
 * encoding was wrong, or the file is not text.
 */
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F]/;

function strictly(label: string, bytes: Uint8Array): string | null {
  try {
    // fatal: a malformed sequence throws instead of becoming U+FFFD (WHATWG Encoding, "error mode").
    return new TextDecoder(label, { fatal: true }).decode(bytes);
  } catch {
    return null;
  }
}

const lineOf = (text: string, index: number) => text.slice(0, index).split(/\r\n|\r|\n/).length;

/** Decodes a CSV file, or says why it cannot be trusted — never text with guessed characters. */
export function decodeCsvBytes(bytes: Uint8Array): DecodedCsv {
  const hasBom = BOM.every((b, i) => bytes[i] === b);
  let encoding: CsvEncoding = "UTF-8";
  // TextDecoder drops a leading BOM itself (WHATWG Encoding, "decode": ignoreBOM false).
  let text = strictly("utf-8", bytes);
  if (text === null && !hasBom) {
    encoding = "Shift_JIS";
    text = strictly("shift_jis", bytes);
  }
  if (text === null) return { ok: false, reason: "undecodable" };
  // A U+FFFD written into the file itself is already a lost character.
  const replacement = text.indexOf("\uFFFD");
  if (replacement >= 0) return { ok: false, reason: "replacement", line: lineOf(text, replacement) };
  const control = CONTROL.exec(text);
  if (control) return { ok: false, reason: "control", line: lineOf(text, control.index) };
  return { ok: true, encoding, text };
}
