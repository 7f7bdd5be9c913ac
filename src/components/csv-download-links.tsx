import { useTranslations } from "next-intl";

type Props = { href: string; label: string; className?: string; testId?: string };

/**
 * A CSV download in the two encodings spreadsheets in Japan open: UTF-8 with a byte-order mark
 * (the default, Excel's "CSV UTF-8") and Shift_JIS (CP932) for programs that read only that.
 * The server refuses the Shift_JIS file, naming the cell, when a value does not fit it.
 */
export function CsvDownloadLinks({ href, label, className, testId }: Props) {
  const t = useTranslations("csv.encodings");
  const shiftJis = `${href}${href.includes("?") ? "&" : "?"}encoding=shift_jis`;
  return (
    <span className="inline-flex flex-wrap items-baseline gap-x-3 gap-y-1">
      <a href={href} download className={className} data-testid={testId} title={t("utf8Title")}>{label}</a>
      <a href={shiftJis} download className="text-sm" data-testid={testId ? `${testId}-sjis` : undefined} title={t("shiftJisTitle")} aria-label={t("shiftJisOf", { label })}>
        {t("shiftJis")}
      </a>
    </span>
  );
}
