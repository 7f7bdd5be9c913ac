/**
 * A qualified invoice issuer's registration number: the letter T and 13 digits (for a
 * company, T and its corporate number). Source: NTA, qualified invoice system guidance —
 * from memory. Only the format is checked here; the NTA's public register is the authority
 * on whether a number is registered.
 */
const PATTERN = /^T\d{13}$/;

/** Spaces and hyphens people type between groups are dropped; a lower-case t is accepted. */
export function normaliseInvoiceNumber(raw: string): string {
  return raw.replace(/[\s\-‐－]/g, "").replace(/^t/, "T");
}

export function isInvoiceNumber(value: string): boolean {
  return PATTERN.test(value);
}
