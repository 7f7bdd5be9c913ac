import { isValidGtin, toGtin14 } from "./gtin";
import { LOT_CODE_PATTERN } from "./lot-code";

/**
 * What a search box may be given, read as the trade writes it. A lot code is typed with or
 * without its hyphen ("H260007" is H26-0007); a GTIN/JAN as printed under the barcode, in
 * groups or not. A JAN-13 is the GTIN-13, and a GTIN-14 with a leading 0 is the same item
 * (GS1 General Specifications §3.3.2, GTIN formats; check digit §7.9).
 */
export type SearchTerms = {
  text: string;
  /** Letters and digits (at least one digit), upper case: compared with lot codes stripped of their hyphen. */
  compactCode: string | null;
  /** A whole lot code, hyphen restored, when the text is one. */
  lotCode: string | null;
  /** The GTIN-14 the text spells, when its check digit holds. */
  gtin14: string | null;
};

export const SEARCH_MAX_LENGTH = 100;
const SPLIT_CODE = /^([A-Z]{1,2}\d{2})-?(\d{4,8})$/;

export function readSearchTerms(input: string): SearchTerms {
  const text = input.normalize("NFKC").trim().replace(/\s+/g, " ").slice(0, SEARCH_MAX_LENGTH);
  const compact = text.toUpperCase().replace(/[\s-]/g, "");
  const split = SPLIT_CODE.exec(compact);
  const lotCode = split && LOT_CODE_PATTERN.test(`${split[1]}-${split[2]}`) ? `${split[1]}-${split[2]}` : null;
  const digits = /^[\d\s-]+$/.test(text) ? text.replace(/[\s-]/g, "") : "";
  return {
    text,
    compactCode: /^(?=.*\d)[A-Z0-9]{3,}$/.test(compact) ? compact : null,
    lotCode,
    gtin14: isValidGtin(digits) ? toGtin14(digits) : null,
  };
}
