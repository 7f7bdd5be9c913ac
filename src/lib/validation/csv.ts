import Papa from "papaparse";
import { z } from "zod";
import { csvSafeCell, csvSafeText } from "@/domain/csv-safe";
import { GRADES } from "@/domain/grades";
import { parseTypedDate, parseTypedNumber } from "@/domain/typed-input";
import { hourOfDayIn } from "@/i18n/dates";
import { eventInputSchema, eventSchema, harvestSchema, lotCode } from "./events";

/** CSV in and out, shared by the browser (reading files, writing downloads) and the server. */
export const IMPORT_KINDS = ["harvests", "receipts"] as const;
export type ImportKind = (typeof IMPORT_KINDS)[number];

export const MAX_IMPORT_ROWS = 10_000;
export const MAX_IMPORT_BYTES = 2 * 1024 * 1024;

/** Columns of each import, in template order; the optional ones may be left out of the header. */
export const IMPORT_COLUMNS: Record<ImportKind, { all: readonly string[]; optional: readonly string[] }> = {
  harvests: { all: ["field", "variety", "cropYear", "brownKg", "moisturePct", "grade", "bags", "harvestedOn"], optional: ["harvestedOn"] },
  receipts: { all: ["lot", "from", "quantity", "receivedOn", "deliverySlip", "place"], optional: [] },
};

/** One example row per template, in the demo's invented names. */
export const TEMPLATE_EXAMPLES: Record<ImportKind, string[]> = {
  harvests: ["field-ikeda-terrace", "Yamada Nishiki", "2026", "600", "14.8", "1", "10", "2026-09-28"],
  receipts: ["H26-0001", "grower-ikeda", "600", "2026-10-02", "DS-1042", "Shirotae Polishing Works, Mill Road 5"],
};

/**
 * Cells as spreadsheets write them: 1,260 (quoted, RFC 4180: unquoted, its comma splits the
 * cell), １２６０, 2026/10/03 or 2026-10-03 — the parsers forms use (src/domain/typed-input.ts).
 * Never Number() alone, which would also take "0x10" and "1e3".
 */
const numeric = z
  .string()
  .trim()
  .min(1)
  .transform((cell, ctx) => parseTypedNumber(cell) ?? (ctx.addIssue({ code: "custom", message: "csv.import.number" }), z.NEVER));
const toDay = (cell: string, ctx: z.RefinementCtx) => parseTypedDate(cell) ?? (ctx.addIssue({ code: "custom", message: "csv.import.date" }), z.NEVER);
const requiredDay = z.string().trim().min(1).transform(toDay);
const optionalDay = z.string().optional().transform((v) => v?.trim() || undefined).pipe(z.string().transform(toDay).optional());
const optionalText = (max: number) => z.string().trim().max(max).default("");

/** A harvest line as read from the file: every cell checked at once, against the harvest's own rules. */
export const harvestCsvRowSchema = z.object({
  field: z.string().trim().min(1).max(64),
  variety: harvestSchema.shape.variety,
  cropYear: numeric.pipe(harvestSchema.shape.cropYear),
  brownKg: numeric.pipe(harvestSchema.shape.brownKg),
  moisturePct: numeric.pipe(harvestSchema.shape.moisturePct),
  grade: z.string().trim().toLowerCase().pipe(z.enum(GRADES)),
  bags: numeric.pipe(harvestSchema.shape.bags),
  harvestedOn: optionalDay,
});
export type HarvestCsvRow = z.infer<typeof harvestCsvRowSchema>;

export const receiptCsvRowSchema = z.object({
  lot: lotCode,
  from: z.string().trim().min(1).max(64),
  quantity: numeric.pipe(eventInputSchema.shape.quantity),
  receivedOn: requiredDay,
  deliverySlip: optionalText(100).pipe(eventSchema.shape.referenceDoc.unwrap()),
  place: optionalText(200).pipe(eventSchema.shape.place.unwrap()),
});
export type ReceiptCsvRow = z.infer<typeof receiptCsvRowSchema>;

/** What the browser sends: the header and each line's cells, with the line it began on. */
export const importRequestSchema = z
  .object({
    kind: z.enum(IMPORT_KINDS),
    header: z.array(z.string().max(100)).min(1).max(40),
    rows: z
      .array(z.object({ line: z.number().int().positive(), cells: z.array(z.string().max(2_000)).max(40) }).strict())
      .min(1)
      .max(MAX_IMPORT_ROWS),
  })
  .strict();
export type ImportRequest = z.infer<typeof importRequestSchema>;

export const dateRangeSchema = z.object({ from: z.iso.date(), to: z.iso.date() });

/** A CSV download's `?encoding=`: UTF-8 with a BOM by default, or Shift_JIS (CP932) for older spreadsheets. */
export const CSV_DOWNLOAD_ENCODINGS = ["utf-8", "shift_jis"] as const;
export type CsvDownloadEncoding = (typeof CSV_DOWNLOAD_ENCODINGS)[number];
export const csvDownloadQuerySchema = z.object({ encoding: z.enum(CSV_DOWNLOAD_ENCODINGS).default("utf-8") });

/**
 * Dates in the files are calendar days on the brewery's clock (its time-zone setting, Asia/Tokyo
 * by default). A day becomes its noon there, which stays on the same calendar day in UTC for
 * every zone within ±11 hours — lot codes take their year from the UTC date.
 */
export const noonOn = (isoDay: string, timeZone: string) => hourOfDayIn(isoDay, 12, timeZone);

/**
 * Writes CSV (RFC 4180, CRLF) with a byte-order mark, without which spreadsheet programs in
 * Japan read UTF-8 as Shift_JIS. Every text cell passes csvSafeCell (OWASP, "CSV Injection"),
 * line breaks or not; numbers stay numbers. papaparse only quotes: its own escapeFormulae
 * misses a formula that holds a line break.
 */
export function csvText(fields: string[], rows: unknown[][]): string {
  const data = rows.map((row) => row.map(csvSafeCell));
  return "\uFEFF" + Papa.unparse({ fields: fields.map(csvSafeText), data }, { newline: "\r\n" });
}

/** Hands CSV text (or its Shift_JIS bytes) to the browser as a file download. */
export function saveCsvFile(fileName: string, content: string | Uint8Array<ArrayBuffer>, charset: "utf-8" | "Shift_JIS" = "utf-8"): void {
  const url = URL.createObjectURL(new Blob([content], { type: `text/csv;charset=${charset}` }));
  const link = Object.assign(document.createElement("a"), { href: url, download: fileName });
  document.body.append(link);
  link.click();
  link.remove();
  // Some browsers start reading the blob only after the click returns.
  setTimeout(() => URL.revokeObjectURL(url), 1_000);
}

export type CsvLine = { line: number; cells: string[] };

/**
 * Gathers papaparse's rows (header: false), chunk by chunk, noting the line of the file each
 * began on: a quoted cell may hold line breaks, and blank lines are skipped but counted.
 */
export function createLineCollector() {
  let next = 1;
  let header: string[] | null = null;
  const rows: CsvLine[] = [];
  return {
    add(data: string[][], linebreak: string): number[] {
      const mark = linebreak === "\r" ? "\r" : "\n";
      return data.map((cells) => {
        const line = next;
        next += 1 + cells.reduce((n, cell) => n + cell.split(mark).length - 1, 0);
        if (cells.every((cell) => cell.trim() === "")) return line;
        if (header) rows.push({ line, cells });
        else header = cells.map((c, i) => (i === 0 ? c.replace(/^\uFEFF/, "") : c));
        return line;
      });
    },
    get header() {
      return header;
    },
    rows,
  };
}
