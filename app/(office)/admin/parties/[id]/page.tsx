import Link from "@/components/app-link";
import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { can } from "@/domain/permissions";
import { getParty } from "@/server/ledger/parties";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { PartyForm } from "../components";
import { withClientMessages } from "@/i18n/client-messages";

async function PartyPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePagePermission("setup:read");
  const { id } = await params;
  const party = getParty(id);
  if (!party) notFound();
  const t = await getTranslations("parties");
  return (
    <div className="space-y-6">
      <p><Link href="/admin/parties">← {t("back")}</Link></p>
      <h1 className="text-3xl font-bold">{party.name}</h1>
      {can(user, "parties:manage") ? (
        <section className="panel">
          <h2 className="mb-4 text-xl font-bold">{t("edit")}</h2>
          <PartyForm party={party} />
        </section>
      ) : (
        <dl className="panel grid grid-cols-[12rem_1fr] gap-2" data-testid="party-view">
          {(["kind", "address", "region", "email", "phone"] as const).map((k) => [
            <dt key={`${k}-t`} className="font-semibold">{t(k)}</dt>,
            <dd key={`${k}-d`}>{k === "kind" ? t(`kinds.${party.kind}`) : party[k] || "—"}</dd>,
          ])}
          <dt className="font-semibold">{t("namedPublicly")}</dt>
          <dd>{party.namedPublicly ? t("yes") : t("no")}</dd>
        </dl>
      )}
    </div>
  );
}

export default withClientMessages(["csv", "errors", "parties", "table"], PartyPage);
