import { getTranslations } from "next-intl/server";
import { SEARCH_MAX_LENGTH } from "@/domain/search-terms";

/** The office header's one search box: a GET form, so it works before scripts load and can be bookmarked. */
export async function SearchBox({ defaultValue = "" }: { defaultValue?: string }) {
  const t = await getTranslations("nav");
  return (
    <form action="/search" method="get" role="search" className="flex items-center gap-1">
      <label htmlFor="site-search" className="sr-only">{t("searchLabel")}</label>
      <input
        id="site-search"
        name="q"
        type="search"
        defaultValue={defaultValue}
        placeholder={t("search")}
        title={t("searchLabel")}
        maxLength={SEARCH_MAX_LENGTH}
        autoComplete="off"
        spellCheck={false}
        className="min-h-11 w-44 rounded border border-cedar bg-paper px-2 text-ink"
      />
      <button type="submit" className="btn-quiet min-h-11 px-3 py-1">{t("search")}</button>
    </form>
  );
}
