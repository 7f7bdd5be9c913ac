import Link from "next/link";
import { getTranslations } from "next-intl/server";

export default async function Forbidden() {
  const t = await getTranslations("errors");
  return (
    <main className="mx-auto max-w-md px-5 py-16">
      <h1 className="text-2xl font-bold">403</h1>
      <p className="notice-warn mt-3">{t("forbidden")}</p>
      <p className="mt-5"><Link href="/">←</Link></p>
    </main>
  );
}
