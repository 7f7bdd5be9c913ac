import Link from "@/components/app-link";
import { notFound } from "next/navigation";
import { getFormatter, getTimeZone, getTranslations } from "next-intl/server";
import { brewDaySummary, isCalendarDate, neighbourBrewDays } from "@/server/floor/brew-days";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { AbsorptionChart, DrawnTable, GainChart, KojiChart, KojiTable, LaterTable, SoakTable, SplitTable, SteamTable } from "./components";
import { withClientMessages } from "@/i18n/client-messages";

type Params = { params: Promise<{ date: string }> };

export async function generateMetadata({ params }: Params) {
  return { title: (await getTranslations("brewDays"))("dayTitle", { date: (await params).date }) };
}

async function BrewDayPage({ params }: Params) {
  const user = await requirePagePermission("records:read-all");
  const { date } = await params;
  if (!isCalendarDate(date)) notFound();
  const day = brewDaySummary(user, date);
  const around = neighbourBrewDays(user, date);
  const t = await getTranslations("brewDays");
  const format = await getFormatter();
  const empty = !day.soaks.length && !day.steams.length && !day.splits.length && !day.later.length && !day.kojiChecks.length;
  const anyCorrected = [...day.soaks, ...day.steams, ...day.splits, ...day.later, ...day.kojiChecks].some((r) => r.corrected);

  return (
    <div className="space-y-8">
      <header className="space-y-2">
        <nav className="flex flex-wrap gap-4 text-sm" aria-label={t("paging")}>
          <Link href="/brew-days">{t("back")}</Link>
          {around.previous ? <Link href={`/brew-days/${around.previous}`} rel="prev">← {around.previous}</Link> : null}
          {around.next ? <Link href={`/brew-days/${around.next}`} rel="next">{around.next} →</Link> : null}
        </nav>
        <h1 className="text-3xl font-bold">{format.dateTime(new Date(`${date}T12:00:00Z`), { dateStyle: "full", timeZone: "UTC" })}</h1>
        <p className="text-ink-soft">{t("timeZoneNote", { zone: await getTimeZone() })}</p>
        {anyCorrected ? <p className="notice text-sm">{t("correctedNote")}</p> : null}
      </header>
      {empty ? <p className="notice">{t("nothing")}</p> : null}
      {day.drawn.length ? (
        <Section title={t("drawn.title")}>
          <DrawnTable rows={day.drawn} />
        </Section>
      ) : null}
      {day.soaks.length ? (
        <Section title={t("soaked.title")}>
          <SoakTable rows={day.soaks} />
          <AbsorptionChart rows={day.soaks} />
        </Section>
      ) : null}
      {day.steams.length ? (
        <Section title={t("steamed.title")}>
          <SteamTable rows={day.steams} />
          <GainChart rows={day.steams} />
        </Section>
      ) : null}
      {day.splits.length ? (
        <Section title={t("split.title")}>
          <SplitTable rows={day.splits} />
        </Section>
      ) : null}
      {day.kojiChecks.length ? (
        <Section title={t("koji.title")}>
          <KojiTable rows={day.kojiChecks} />
          <KojiChart rows={day.kojiChecks} />
        </Section>
      ) : null}
      {day.later.length ? (
        <Section title={t("later.title")}>
          <LaterTable rows={day.later} />
        </Section>
      ) : null}
    </div>
  );
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="space-y-4">
      <h2 className="text-xl font-bold">{title}</h2>
      {children}
    </section>
  );
}

export default withClientMessages(["brewDays"], BrewDayPage);
