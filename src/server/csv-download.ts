import "server-only";
import iconv from "iconv-lite";
import Papa from "papaparse";
import { csvDownloadQuerySchema, type CsvDownloadEncoding } from "@/lib/validation/csv";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { invalid } from "./errors";

/** The `encoding` a CSV download asks for: UTF-8 unless it says otherwise; anything else is 422. */
export function csvEncodingOf(request: Request, t: Translate): CsvDownloadEncoding {
  const raw = new URL(request.url).searchParams.get("encoding");
  const parsed = csvDownloadQuerySchema.safeParse({ encoding: raw ?? undefined });
  if (!parsed.success) throw invalid(fieldErrorsFrom(parsed.error, t));
  return parsed.data.encoding;
}

// iconv-lite's "cp932" is Microsoft's Windows-31J table: what Excel in Japan reads as "CSV".
const CP932 = "cp932";
const fitsCp932 = (text: string) => iconv.decode(iconv.encode(text, CP932), CP932) === text;

/**
 * The first cell CP932 cannot hold, as a spreadsheet would number it (the header is row 1) and
 * by its column's header. iconv-lite writes "?" for such a character; we refuse instead.
 */
function firstMisfit(text: string): { row: number; column: string; value: string } | null {
  const rows = Papa.parse<string[]>(text, { skipEmptyLines: false }).data;
  for (const [r, cells] of rows.entries()) {
    for (const [c, cell] of cells.entries()) {
      if (fitsCp932(cell)) continue;
      const value = [...cell].find((ch) => !fitsCp932(ch)) ?? cell;
      return { row: r + 1, column: rows[0]?.[c] ?? String(c + 1), value };
    }
  }
  return null;
}

/** CSV text (from csvText: BOM first) as the bytes of the encoding asked for. */
export function encodeCsv(text: string, encoding: CsvDownloadEncoding, t: Translate): Uint8Array {
  if (encoding === "utf-8") return new TextEncoder().encode(text.startsWith("\uFEFF") ? text : `\uFEFF${text}`);
  // A BOM means nothing in Shift_JIS, and CP932 has no code for U+FEFF.
  const plain = text.replace(/^\uFEFF/, "");
  if (!fitsCp932(plain)) {
    const misfit = firstMisfit(plain) ?? { row: 1, column: "", value: "" };
    throw invalid({ encoding: [t("errors.csvNotShiftJis", misfit)] }, { key: "errors.csvNotShiftJis", values: misfit });
  }
  return new Uint8Array(iconv.encode(plain, CP932));
}

/** The download itself: the text encoded as asked, labelled with its charset. */
export function csvDownload(text: string, encoding: CsvDownloadEncoding, fileName: string, t: Translate, cacheControl = "no-store"): Response {
  const bytes = encodeCsv(text, encoding, t);
  const charset = encoding === "utf-8" ? "utf-8" : "Shift_JIS";
  const name = encoding === "utf-8" ? fileName : fileName.replace(/\.csv$/, "-sjis.csv");
  return new Response(bytes, {
    headers: {
      "content-type": `text/csv; charset=${charset}`,
      "content-disposition": `attachment; filename="${name}"`,
      "cache-control": cacheControl,
    },
  });
}
