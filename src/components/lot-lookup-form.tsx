import { getTranslations } from "next-intl/server";
import { ScanCodeInput } from "./floor/code-field";

/** Code entry that works without the camera and without JavaScript: a GET form. */
export async function LotLookupForm({ action, defaultCode }: { action: string; defaultCode?: string }) {
  const t = await getTranslations("lookup");
  return (
    <form action={action} method="get" className="flex flex-wrap items-end gap-3" role="search">
      {/* Without JavaScript the input still posts; with it, a scan button fills it from the camera. */}
      <div className="min-w-0 flex-1">
        <ScanCodeInput id="lookup-code" name="code" label={t("typeCode")} defaultValue={defaultCode} />
      </div>
      <button type="submit" className="btn">
        {t("find")}
      </button>
    </form>
  );
}
