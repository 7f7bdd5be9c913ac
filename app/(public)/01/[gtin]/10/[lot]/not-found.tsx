import { getTranslations } from "next-intl/server";

export default async function BottleNotFound() {
  const t = await getTranslations("provenance");
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-bold">{t("publicTitle")}</h1>
      <p className="notice">{t("publicNotFound")}</p>
    </div>
  );
}
