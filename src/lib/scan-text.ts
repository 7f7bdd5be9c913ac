import { isValidGtin } from "@/domain/gtin";
import { isValidLotCode, normaliseLotCode } from "@/domain/lot-code";

/** Where a lot code came from: our label's address, a bottle's GS1 Digital Link, or typed. */
export type ScanSource = "label" | "digital-link" | "typed";
export type ScanReading = { code: string; source: ScanSource };

// Our lot label: {origin}/l/{CODE}, and {origin}/lots/{CODE} on labels printed before it
// (src/domain/label-url.ts). QR encoders may upper-case a URL to fit alphanumeric mode, so the
// path is matched case-insensitively.
const LABEL_PATH = /\/(?:lots|l)\/([^/]+)\/?$/i;

// GS1 Digital Link Standard: URI Syntax: a domain with an optional path of its own, then
// /01/{gtin} and the key qualifiers in the standard's order (22 consumer product variant,
// 10 batch/lot, 21 serial); data attributes go in the query. The GTIN may be written as
// GTIN-8, -12, -13 or -14 (decoders pad it to 14).
const DIGITAL_LINK_PATH = /\/01\/(\d{8}|\d{12,14})(?:\/22\/[^/]+)?\/10\/([^/]+)(?:\/21\/[^/]+)?\/?$/;

// A code typed without its hyphen ("P260002"): the year is always two digits, so the
// hyphen's place is certain (LOT_CODE_PATTERN in src/domain/lot-code.ts).
const WITHOUT_HYPHEN = /^([A-Z]{1,2}\d{2})(\d{4,8})$/;

function percentDecode(segment: string): string | null {
  try {
    return decodeURIComponent(segment);
  } catch {
    return null;
  }
}

function asLotCode(raw: string | null): string | null {
  if (raw === null) return null;
  const code = normaliseLotCode(raw);
  if (isValidLotCode(code)) return code;
  const joined = WITHOUT_HYPHEN.exec(code);
  return joined && isValidLotCode(`${joined[1]}-${joined[2]}`) ? `${joined[1]}-${joined[2]}` : null;
}

function readUrl(text: string): ScanReading | null {
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    return null;
  }
  if (url.protocol !== "https:" && url.protocol !== "http:") return null;
  const label = LABEL_PATH.exec(url.pathname);
  if (label) {
    const code = asLotCode(percentDecode(label[1]!));
    return code ? { code, source: "label" } : null;
  }
  const link = DIGITAL_LINK_PATH.exec(url.pathname);
  if (link && isValidGtin(link[1]!)) {
    const code = asLotCode(percentDecode(link[2]!));
    return code ? { code, source: "digital-link" } : null;
  }
  return null;
}

/**
 * What a scan (or a keyboard-wedge scanner, or a person typing) yields: a Grainline lot
 * code, or null for anything that is not one of ours.
 */
export function readScanText(text: string): ScanReading | null {
  const trimmed = text.trim();
  if (/^https?:\/\//i.test(trimmed)) return readUrl(trimmed);
  const code = asLotCode(trimmed);
  return code ? { code, source: "typed" } : null;
}

/** The lot code alone, for callers that do not care where it came from. */
export function lotCodeFromScan(text: string): string | null {
  return readScanText(text)?.code ?? null;
}
