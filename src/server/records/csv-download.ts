import "server-only";
import iconv from "iconv-lite";
import { csvDownloadQuerySchema, type CsvDownloadEncoding } from "@/lib/validation/csv";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { firstMisfitCell } from "@/lib/shift-jis";
import { invalid } from "../platform/errors";

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

/** CSV text (from csvText: BOM first) as the bytes of the encoding asked for. */
export function encodeCsv(text: string, encoding: CsvDownloadEncoding, t: Translate): Uint8Array<ArrayBuffer> {
  if (encoding === "utf-8") return new TextEncoder().encode(text.startsWith("\uFEFF") ? text : `\uFEFF${text}`);
  // A BOM means nothing in Shift_JIS, and CP932 has no code for U+FEFF.
  const plain = text.replace(/^\uFEFF/, "");
  if (!fitsCp932(plain)) {
    // iconv-lite would write "?" for such a character; the person is told which cell instead.
    const misfit = firstMisfitCell(plain, fitsCp932) ?? { row: 1, column: "", value: "" };
    throw invalid({ encoding: [t("errors.csvNotShiftJis", misfit)] }, { key: "errors.csvNotShiftJis", values: misfit });
  }
  return Uint8Array.from(iconv.encode(plain, CP932));
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
