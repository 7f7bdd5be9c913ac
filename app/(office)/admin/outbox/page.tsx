import { getTranslations } from "next-intl/server";
import { listOutbox } from "@/server/mail";
import { requirePagePermission } from "@/server/page-guard";
import { OutboxTable } from "./components";

export async function generateMetadata() {
  return { title: (await getTranslations("outbox"))("title") };
}

export default async function OutboxPage() {
  await requirePagePermission("outbox:read");
  const t = await getTranslations("outbox");
  return (
    <div className="space-y-6">
      <header>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </header>
      <OutboxTable rows={listOutbox()} />
    </div>
  );
}
