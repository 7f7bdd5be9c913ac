import { getTranslations } from "next-intl/server";

export default async function NotFound() {
  const t = await getTranslations("errors");
  return (
    <main className="mx-auto max-w-md px-5 py-16">
      <h1 className="text-2xl font-bold">404</h1>
      <p className="notice mt-3">{t("not_found")}</p>
      {/* A plain link: the way home from an error is a fresh page load, and a next/link here put
          its code (3.3 kB gzip) into the scripts of every page, whose payload carries this page. */}
      <p className="mt-5"><a href="/">←</a></p>
    </main>
  );
}
