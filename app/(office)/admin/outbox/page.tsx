import { getTranslations } from "next-intl/server";
import { listOutbox } from "@/server/platform/mail";
import { requirePagePermission } from "@/server/accounts/page-guard";
import { OutboxTable } from "./components";
import { PageHeader } from "@/components/page-header";
import { withClientMessages } from "@/i18n/client-messages";

export async function generateMetadata() {
  return { title: (await getTranslations("outbox"))("title") };
}

async function OutboxPage() {
  await requirePagePermission("outbox:read");
  const t = await getTranslations("outbox");
  return (
    <div className="space-y-6">
      <PageHeader title={t("title")} intro={t("intro")} />
      <OutboxTable rows={listOutbox()} />
    </div>
  );
}

export default withClientMessages(["csv", "errors", "outbox", "table"], OutboxPage);
