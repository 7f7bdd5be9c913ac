import "server-only";
import type { DbOrTx } from "@/db/client";
import type { Translate } from "@/lib/validation/field-errors";
import { sendMail } from "./mail";
import { statementPdf } from "./supplier-statement-files";
import type { StatementView } from "./supplier-statements";

const yen = (v: number) => new Intl.NumberFormat("en-US").format(v);

/** The path a statement's PDF downloads from (sign-in required: the supplier's own account). */
export const statementPdfPath = (partyId: string, number: string) => `/api/suppliers/${encodeURIComponent(partyId)}/statements/${encodeURIComponent(number)}/statement.pdf`;

/**
 * E-mails a statement to the supplier through the outbox. The PDF goes along as an
 * attachment (nodemailer's JSON transport keeps it); the outbox stores only the text, so the
 * text also links to the PDF in the supplier's account.
 */
export async function mailStatement(view: StatementView, origin: string, t: Translate, db?: DbOrTx, options?: { deliver?: boolean }): Promise<string> {
  const pdf = await statementPdf(view, t);
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
      total: yen(view.totals.grossYen),
      balance: yen(view.balanceYen),
      file: fileName,
      link: `${origin}${statementPdfPath(view.supplier.id, view.number)}`,
    }),
    attachments: [{ filename: fileName, content: Buffer.from(pdf), contentType: "application/pdf" }],
  }, db, options);
}
