import { digitalLinkUri, isValidGtin } from "./gtin";
import { normaliseLotCode } from "./lot-code";

/**
 * The address a lot's label carries: the lot's page on this Grainline. The code is one
 * path segment, so it is percent-encoded (RFC 3986 §2.1, §3.3): a "/" or "%" in a code
 * must not turn into a path separator or a stray escape when a phone opens the link.
 */
export function lotPageUrl(origin: string, code: string): string {
  return `${origin.replace(/\/+$/, "")}/lots/${encodeURIComponent(code)}`;
}

/**
 * The address a lot's label carries (`/l/{code}`): one route that opens the floor card on a
 * phone and the office lot page on a desk (app/l/[code]/page.tsx). Shorter than the lot page's
 * address, so the QR code stays small; encoded as lotPageUrl is.
 */
export function labelPageUrl(origin: string, code: string): string {
  return `${origin.replace(/\/+$/, "")}${labelPagePath(code)}`;
}

export function labelPagePath(code: string): string {
  return `/l/${encodeURIComponent(code)}`;
}

/** A sheet is 24 labels; 200 is a little over 8 sheets, enough for a season's delivery at once. */
export const MAX_LABEL_CODES = 200;

/**
 * The `codes` of a label-sheet address (`/labels?codes=H26-0001,P26-0002`): also
 * repeated parameters and pasted lists split by spaces, semicolons or new lines.
 * Codes are normalised as typed at the scanner, blanks dropped, duplicates kept once,
 * in the order given.
 */
export function parseLabelCodes(raw: string | string[] | undefined): string[] {
  const parts = (Array.isArray(raw) ? raw : [raw ?? ""]).flatMap((value) => value.split(/[\s,;]+/));
  const codes = parts.map(normaliseLotCode).filter((code) => code.length > 0);
  return [...new Set(codes)];
}

/** The address of a label sheet for these codes, e.g. for a link after registering a harvest. */
export function labelSheetPath(codes: readonly string[], layout: "sheet" | "bag" = "sheet"): string {
  const query = new URLSearchParams({ codes: codes.join(",") });
  if (layout === "bag") query.set("layout", "bag");
  return `/labels?${query.toString()}`;
}

/**
 * What a lot's QR code holds: a bottle carries its GS1 Digital Link URI (GTIN + lot, the
 * public provenance page); every other lot carries its label address in Grainline.
 */
export function labelUrl(origin: string, lot: { code: string; kind: string; attributes: Record<string, unknown> }): string {
  const gtin = lot.attributes.gtin;
  if (lot.kind === "bottled" && typeof gtin === "string" && isValidGtin(gtin)) return digitalLinkUri(origin, gtin, lot.code);
  return labelPageUrl(origin, lot.code);
}
