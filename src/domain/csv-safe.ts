/**
 * Spreadsheet formula injection (OWASP, "CSV Injection"): a spreadsheet opening a CSV runs a
 * cell whose first character is = + - or @ as a formula, and a leading TAB or CR can hide one.
 * OWASP's remedy is a leading apostrophe, which every spreadsheet shows as text.
 */
const OWASP_LEADING = new Set(["=", "+", "-", "@", "\t", "\r"]);

/**
 * Beyond OWASP's list, and defensive (from memory, not a published list): the full-width forms
 * a Japanese input method types for = + - @, which Excel in Japan may take as the ASCII ones.
 */
const FULL_WIDTH = new Set(["\uFF1D", "\uFF0B", "\uFF0D", "\uFF20"]);

/** Blanks a cell may start with: spaces, tabs, line breaks, the ideographic space. */
const LEADING_BLANKS = /^[\s\u3000]+/u;

const isTrigger = (ch: string | undefined) => ch !== undefined && (OWASP_LEADING.has(ch) || FULL_WIDTH.has(ch));

/**
 * Whether a spreadsheet could run this cell. Looks only at how the cell begins — what follows,
 * line breaks included, does not matter (papaparse's own check, /^[=+\-@\t\r].*$/, misses a
 * formula with a line break in it, because "." stops at the break). Also a trigger behind
 * leading blanks: importers that trim cells (LibreOffice Calc's "Trim spaces" import option,
 * from memory) would bring it to the front.
 */
export function isFormulaLike(cell: string): boolean {
  return isTrigger(cell[0]) || isTrigger(cell.replace(LEADING_BLANKS, "")[0]);
}

/** The text to write for a cell: with a leading apostrophe when a spreadsheet could run it. */
export function csvSafeText(cell: string): string {
  return isFormulaLike(cell) ? `'${cell}` : cell;
}

/** Any value headed for a CSV cell: text is made safe; numbers, booleans and empty cells stay as they are. */
export function csvSafeCell(value: unknown): unknown {
  return typeof value === "string" ? csvSafeText(value) : value;
}
