import { getTranslations } from "next-intl/server";
import { HoldForm } from "@/components/hold-form";
import { holdRecallAction, releaseRecallAction } from "./actions";

/** Hold every reached lot, or release them all, from the recall; the office only, with the usual caution. */
export async function HoldPanel({ code, reached, held, mayHold }: { code: string; reached: number; held: number; mayHold: boolean }) {
  const t = await getTranslations("holds");
  return (
    <section className="panel space-y-3" aria-labelledby="recall-holds" data-testid="recall-holds">
      <h3 id="recall-holds" className="text-xl font-bold">{t("title")}</h3>
      <p className="font-semibold" data-testid="recall-held-summary">{t("heldSummary", { held })}</p>
      <p role="note" className="notice-warn text-sm">⚠ {t("caution")}</p>
      {mayHold ? (
        <div className="grid gap-6 md:grid-cols-2">
          <div>
            <p className="mb-2 text-sm">{t("holdAllIntro", { count: reached })}</p>
            <HoldForm action={holdRecallAction} code={code} id="hold-all" submit={t("holdAll")} tone="warn" />
          </div>
          {held > 0 ? <HoldForm action={releaseRecallAction} code={code} id="release-all" submit={t("releaseAll")} /> : null}
        </div>
      ) : null}
    </section>
  );
}
