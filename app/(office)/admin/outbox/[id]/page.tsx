import Link from "@/components/app-link";
import { notFound } from "next/navigation";
import { getFormatter, getTranslations } from "next-intl/server";
import { LinkedText } from "@/components/linked-text";
import { getOutboxMessage } from "@/server/platform/mail";
import { requirePagePermission } from "@/server/accounts/page-guard";

export default async function OutboxMessagePage({ params }: { params: Promise<{ id: string }> }) {
  await requirePagePermission("outbox:read");
  const { id } = await params;
  const message = getOutboxMessage(id);
  if (!message) notFound();
  const t = await getTranslations("outbox");
  const format = await getFormatter();
  return (
    <div className="space-y-4">
      <p><Link href="/admin/outbox">← {t("back")}</Link></p>
      <article className="panel space-y-3" data-testid="outbox-message">
        <h1 className="text-2xl font-bold">{message.subject}</h1>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="font-semibold">{t("from")}</dt><dd>{message.fromAddress}</dd>
          <dt className="font-semibold">{t("to")}</dt><dd>{message.toAddress}</dd>
          <dt className="font-semibold">{t("sentAt")}</dt><dd>{format.dateTime(message.createdAt, "dayTime")}</dd>
          <dt className="font-semibold">{t("transport")}</dt><dd>{t(`transports.${message.transport}`)}</dd>
        </dl>
        <pre className="whitespace-pre-wrap font-[family-name:var(--font-body)] text-base">
          <LinkedText text={message.textBody} />
        </pre>
      </article>
    </div>
  );
}
