import Link from "next/link";
import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { getParty } from "@/server/parties";
import { requirePagePermission } from "@/server/page-guard";
import { PartyForm } from "../components";

export default async function PartyPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePagePermission("parties:manage");
  const { id } = await params;
  const party = getParty(id);
  if (!party) notFound();
  const t = await getTranslations("parties");
  return (
    <div className="space-y-6">
      <p><Link href="/admin/parties">← {t("back")}</Link></p>
      <h1 className="text-3xl font-bold">{party.name}</h1>
      <section className="panel">
        <h2 className="mb-4 text-xl font-bold">{t("edit")}</h2>
        <PartyForm party={party} />
      </section>
    </div>
  );
}
