/**
 * Grainline lot codes: a kind letter, the two-digit year, a hyphen and a sequence,
 * e.g. "H26-0007" (harvest of 2026, seventh). Short enough to read out over a tank,
 * and a valid GS1 batch/lot value (AI 10): at most 20 characters, all from GS1's
 * character set 82 (GS1 General Specifications, figure 7.11-1).
 */
export const LOT_CODE_PATTERN = /^[A-Z]{1,2}\d{2}-\d{4,8}$/;
export const GS1_AI10_MAX_LENGTH = 20;

// GS1 character set 82: the printable ASCII subset allowed in alphanumeric AIs.
const GS1_CSET82 = /^[!"%&'()*+,\-./0-9:;<=>?A-Z_a-z]*$/;

export function isGs1Cset82(value: string): boolean {
  return GS1_CSET82.test(value);
}

export function isValidLotCode(code: string): boolean {
  return code.length <= GS1_AI10_MAX_LENGTH && isGs1Cset82(code) && LOT_CODE_PATTERN.test(code);
}

/** What a person types or a scanner reads, made comparable: trimmed, upper case, no spaces. */
export function normaliseLotCode(input: string): string {
  return input.trim().toUpperCase().replace(/\s+/g, "").slice(0, 64);
}
