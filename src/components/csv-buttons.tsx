"use client";

import { useState } from "react";
import { useTranslations } from "next-intl";

// The CSV writer (papaparse, and zod through the import schemas beside it) and the Shift_JIS
// table load on the first download, not with every page that shows a table.
const csvTools = () => import("@/lib/validation/csv");
const shiftJisTools = () => import("@/lib/shift-jis");

type CsvText = (headers: string[], rows: unknown[][]) => string;

/**
 * Saving a table's CSV, UTF-8 or Shift_JIS. As the server's Shift_JIS downloads: a value
 * Shift_JIS cannot hold is named (`problem`), never written as "?".
 */
export function useCsvSave(exportName: string, build: (csvText: CsvText) => string) {
  const te = useTranslations("errors");
  const [problem, setProblem] = useState<string | null>(null);
  async function download() {
    const { csvText, saveCsvFile } = await csvTools();
    saveCsvFile(`${exportName}.csv`, build(csvText));
  }
  async function downloadShiftJis() {
    const [{ csvText, saveCsvFile }, { encodeShiftJis, firstMisfitCell, fitsShiftJis }] = await Promise.all([csvTools(), shiftJisTools()]);
    const text = build(csvText).replace(/^\uFEFF/, "");
    const bytes = encodeShiftJis(text);
    const misfit = bytes ? null : firstMisfitCell(text, fitsShiftJis);
    setProblem(misfit ? te("csvNotShiftJis", misfit) : null);
    if (bytes) saveCsvFile(`${exportName}-sjis.csv`, bytes, "Shift_JIS");
  }
  return { download, downloadShiftJis, problem };
}

/** The two download buttons of a table. */
export function CsvButtons({ save, testId }: { save: ReturnType<typeof useCsvSave>; testId?: string }) {
  const tc = useTranslations("csv");
  return (
    <>
      <button type="button" className="btn-quiet" title={tc("downloadTitle")} onClick={save.download}>
        {tc("download")}
      </button>
      <button type="button" className="text-sm underline" title={tc("encodings.shiftJisTitle")} aria-label={tc("encodings.shiftJisOf", { label: tc("download") })} data-testid={testId ? `${testId}-csv-sjis` : undefined} onClick={save.downloadShiftJis}>
        {tc("encodings.shiftJis")}
      </button>
    </>
  );
}
