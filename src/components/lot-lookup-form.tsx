import { getTranslations } from "next-intl/server";

/** Code entry that works without the camera and without JavaScript: a GET form. */
export async function LotLookupForm({ action, defaultCode, large }: { action: string; defaultCode?: string; large?: boolean }) {
  const t = await getTranslations("lookup");
  return (
    <form action={action} method="get" className="flex flex-wrap items-end gap-3" role="search">
      <label className="min-w-0 flex-1">
        <span className={large ? "block text-lg font-semibold" : "field-label"}>{t("typeCode")}</span>
        <input
          name="code"
          defaultValue={defaultCode}
          placeholder={t("placeholder")}
          autoCapitalize="characters"
          autoComplete="off"
          spellCheck={false}
          maxLength={20}
          className={`field-input font-[family-name:var(--font-code)] uppercase ${large ? "min-h-14 text-2xl" : ""}`}
        />
      </label>
      <button type="submit" className={`btn ${large ? "min-h-14 px-6 text-xl" : ""}`}>
        {t("find")}
      </button>
    </form>
  );
}
