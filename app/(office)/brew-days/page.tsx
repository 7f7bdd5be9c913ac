import Link from "@/components/app-link";
import { getFormatter, getTranslations } from "next-intl/server";
import { BREW_DAY_STEPS, listBrewDays } from "@/server/floor/brew-days";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { PageHeader } from "@/components/page-header";

export async function generateMetadata() {
  return { title: (await getTranslations("brewDays"))("title") };
}

export default async function BrewDaysPage() {
  const user = await requirePagePermission("records:read-all");
  const t = await getTranslations("brewDays");
  const format = await getFormatter();
  const days = listBrewDays(user);
  return (
    <div className="space-y-6">
      <PageHeader title={t("title")} intro={t("intro")} />
      {days.length === 0 ? (
        <p className="notice">{t("empty")}</p>
      ) : (
        <div className="overflow-x-auto rounded-lg border-2 border-paper-deep bg-white">
          <table className="w-full border-collapse text-sm" data-testid="brew-days">
            <caption className="sr-only">{t("title")}</caption>
            <thead className="bg-paper-deep text-left">
              <tr>
                <th scope="col" className="px-3 py-2">{t("date")}</th>
                {BREW_DAY_STEPS.map((s) => <th key={s} scope="col" className="px-3 py-2 text-right">{t(`steps.${s}`)}</th>)}
                <th scope="col" className="px-3 py-2 text-right">{t("kojiChecks")}</th>
                <th scope="col" className="px-3 py-2 text-right">{t("total")}</th>
              </tr>
            </thead>
            <tbody>
              {days.map((d) => (
                <tr key={d.date} className="border-t border-paper-deep">
                  <th scope="row" className="px-3 py-2 text-left font-semibold">
                    {/* Noon in Tokyo names the calendar day whatever the viewer's clock says. */}
                    <Link href={`/brew-days/${d.date}`}>{format.dateTime(new Date(`${d.date}T12:00:00Z`), { dateStyle: "full", timeZone: "UTC" })}</Link>
                  </th>
                  {BREW_DAY_STEPS.map((s) => <td key={s} className="px-3 py-2 text-right tabular-nums">{d.counts[s] || "—"}</td>)}
                  <td className="px-3 py-2 text-right tabular-nums">{d.kojiChecks || "—"}</td>
                  <td className="px-3 py-2 text-right font-semibold tabular-nums">{d.total}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
