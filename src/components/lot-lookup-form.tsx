import { getTranslations } from "next-intl/server";

/** Code entry that works without the camera and without JavaScript: a GET form. */
export async function LotLookupForm({ action, defaultCode }: { action: string; defaultCode?: string }) {
  const t = await getTranslations("lookup");
  return (
    <form action={action} method="get" className="flex flex-wrap items-end gap-3" role="search">
      <label className="min-w-0 flex-1">
        <span className="field-label">{t("typeCode")}</span>
        <input
          name="code"
          defaultValue={defaultCode}
          placeholder={t("placeholder")}
          autoCapitalize="characters"
          autoComplete="off"
          spellCheck={false}
          maxLength={20}
          className="field-input font-[family-name:var(--font-code)] uppercase"
        />
      </label>
      <button type="submit" className="btn">
        {t("find")}
      </button>
    </form>
  );
}
