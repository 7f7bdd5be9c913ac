import "server-only";
import { and, asc, eq, isNotNull } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { users } from "@/db/schema";
import { DEFAULT_LOCALE, type Locale } from "@/i18n/locale";
import { documentTranslator } from "../platform/document-locale";
import { getDb } from "../platform/db";
import { sendMail } from "../platform/mail";
import { breweryTimeZone } from "../platform/settings";
import { statementPdf } from "./supplier-statement-files";
import type { StatementView } from "./supplier-statements";

/** The path a statement's PDF downloads from (sign-in required: the supplier's own account). */
export const statementPdfPath = (partyId: string, number: string) => `/api/suppliers/${encodeURIComponent(partyId)}/statements/${encodeURIComponent(number)}/statement.pdf`;

/**
 * The supplier's language: the setting of its user who has the account's e-mail address, else
 * of any of its users who chose one; Japanese when none did — never the office's screen language.
 */
export function supplierLocale(db: DbOrTx, partyId: string, email: string | null): Locale {
  const chosen = db.select({ email: users.email, locale: users.locale }).from(users).where(and(eq(users.partyId, partyId), isNotNull(users.locale))).orderBy(asc(users.createdAt)).all();
  return (chosen.find((u) => u.email === email) ?? chosen[0])?.locale ?? DEFAULT_LOCALE;
}

/**
 * E-mails a statement to the supplier through the outbox, mail and PDF in the supplier's
 * language. The PDF goes along as an attachment (nodemailer's JSON transport keeps it); the
 * outbox stores only the text, so the text also links to the PDF in the supplier's account.
 */
export async function mailStatement(view: StatementView, origin: string, db: DbOrTx = getDb(), options?: { deliver?: boolean }): Promise<string> {
  const locale = supplierLocale(db, view.supplier.id, view.supplier.email);
  const t = documentTranslator(locale);
  const pdf = await statementPdf(view, { t, locale, timeZone: breweryTimeZone(db) });
  const yen = new Intl.NumberFormat(locale);
  const fileName = `${view.number}.pdf`;
  return sendMail({
    to: view.supplier.email,
    subject: t("suppliers.mail.subject", { number: view.number, issuer: view.issuer }),
    text: t("suppliers.mail.body", {
      name: view.supplier.name,
      issuer: view.issuer,
      number: view.number,
      from: view.from,
      to: view.to,
      total: yen.format(view.totals.grossYen),
      balance: yen.format(view.balanceYen),
      file: fileName,
      link: `${origin}${statementPdfPath(view.supplier.id, view.number)}`,
    }),
    attachments: [{ filename: fileName, content: Buffer.from(pdf), contentType: "application/pdf" }],
  }, db, { deliver: options?.deliver });
}
