"use client";

import { useTranslations } from "next-intl";

/** The browser's own print dialog: the label sheet is laid out for it by the page's print CSS. */
export function PrintButton() {
  const t = useTranslations("labels");
  return (
    <button type="button" className="btn print:hidden" onClick={() => window.print()} data-testid="print-labels">
      {t("print")}
    </button>
  );
}
