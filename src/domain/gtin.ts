/**
 * GTINs and GS1 Digital Link URIs for bottle labels (GS1 General Specifications §7.9 check
 * digit: weights 3,1,3,… from the right, check = (10 − sum mod 10) mod 10; GS1 Digital Link
 * URI syntax 1.x: /01/{gtin14}/10/{lot}, values percent-encoded).
 */
export function gtinCheckDigit(body: string): number {
  if (!/^\d+$/.test(body)) throw new RangeError("a GTIN has digits only");
  let sum = 0;
  for (let i = 0; i < body.length; i++) {
    const digit = body.charCodeAt(body.length - 1 - i) - 48;
    sum += digit * (i % 2 === 0 ? 3 : 1);
  }
  return (10 - (sum % 10)) % 10;
}

/** GTIN-8, -12, -13 or -14 with a correct check digit. */
export function isValidGtin(gtin: string): boolean {
  if (!/^\d{8}$|^\d{12,14}$/.test(gtin)) return false;
  return gtinCheckDigit(gtin.slice(0, -1)) === Number(gtin.at(-1));
}

/** The 14-digit form Digital Link and EPCIS use: left-padded with zeros. */
export function toGtin14(gtin: string): string {
  if (!isValidGtin(gtin)) throw new RangeError(`not a valid GTIN: ${gtin}`);
  return gtin.padStart(14, "0");
}

/** `{origin}/01/{gtin14}/10/{lot}` — the path our public bottle page answers on. */
export function digitalLinkUri(origin: string, gtin: string, lot: string): string {
  return `${origin.replace(/\/+$/, "")}/01/${toGtin14(gtin)}/10/${encodeURIComponent(lot)}`;
}
