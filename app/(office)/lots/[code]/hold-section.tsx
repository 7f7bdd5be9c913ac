import { getFormatter, getTranslations } from "next-intl/server";
import { HoldForm } from "@/components/hold-form";
import type { Hold, HoldRow } from "@/server/trace/holds";
import { releaseLotAction } from "./actions";

/** The lot's hold (if any) at the top of its page, its holds and releases, and the office's release. */
export async function HoldSection({ code, hold, history, mayRelease }: { code: string; hold: Hold | null; history: HoldRow[]; mayRelease: boolean }) {
  if (!hold && history.length === 0) return null;
  const t = await getTranslations("holds");
  const format = await getFormatter();
  const date = (iso: string) => format.dateTime(new Date(iso), "dayTime");
  return (
    <section className="panel max-w-2xl space-y-3" aria-labelledby="lot-holds" data-testid="lot-holds">
      {hold ? (
        <p role="alert" className="notice-warn font-semibold" data-testid="lot-on-hold">
          {t("onHoldSince", { date: date(hold.at), reason: hold.reason })}
          {hold.recallCode ? t("fromRecall", { code: hold.recallCode }) : null}
        </p>
      ) : null}
      <h2 id="lot-holds" className="text-xl font-bold">{t("history")}</h2>
      <ul className="space-y-1 text-sm" data-testid="lot-hold-history">
        {history.map((h) => (
          <li key={h.id}>{t("entry", { action: t(`actions.${h.action}`), date: date(h.at), user: h.userName, reason: h.reason })}</li>
        ))}
      </ul>
      {hold ? <p role="note" className="text-sm text-ink-soft">⚠ {t("caution")}</p> : null}
      {hold && mayRelease ? <HoldForm action={releaseLotAction} code={code} id="release-lot" submit={t("release")} /> : null}
    </section>
  );
}
