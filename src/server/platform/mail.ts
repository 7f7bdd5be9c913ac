import "server-only";
import nodemailer from "nodemailer";
import { desc, eq } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import type { DbOrTx } from "@/db/client";
import { outbox } from "@/db/schema";
import { DEFAULT_LOCALE, type Locale } from "@/i18n/locale";
import { translator } from "@/i18n/messages";
import { getDb } from "./db";

// Attachments go to the transport (the JSON transport keeps them, base64); the outbox row keeps the text only.
export type OutgoingMail = { to: string; subject: string; text: string; html?: string; attachments?: { filename: string; content: Buffer; contentType: string }[] };

/** A mail is worded in its reader's own language setting, else Japanese — never the sender's screen language. */
export function mailTranslator(readerSetting: Locale | null | undefined) {
  return translator(readerSetting ?? DEFAULT_LOCALE);
}

const FROM = () => process.env.GRAINLINE_MAIL_FROM || "Grainline <no-reply@grainline.invalid>";

/**
 * Without SMTP_HOST nothing leaves the machine: the JSON transport renders the message
 * and the outbox table keeps it for the admin's outbox page.
 */
function transport(deliver: boolean) {
  const host = process.env.SMTP_HOST;
  if (!host || !deliver) return { kind: "local" as const, t: nodemailer.createTransport({ jsonTransport: true }) };
  return {
    kind: "smtp" as const,
    t: nodemailer.createTransport({
      host,
      port: Number(process.env.SMTP_PORT || 587),
      secure: process.env.SMTP_SECURE === "true",
      auth: process.env.SMTP_USER ? { user: process.env.SMTP_USER, pass: process.env.SMTP_PASSWORD } : undefined,
    }),
  };
}

/**
 * `db`: the connection to keep the outbox row in — the seed passes the database it is seeding.
 * `deliver: false` keeps the message in the outbox even when SMTP is set up (the demo seed's
 * statements are addressed to invented parties and must never leave the machine).
 */
export async function sendMail(mail: OutgoingMail, db: DbOrTx = getDb(), { deliver = true }: { deliver?: boolean } = {}): Promise<string> {
  const { kind, t } = transport(deliver);
  const from = FROM();
  await t.sendMail({ from, ...mail });
  const id = randomUUID();
  db
    .insert(outbox)
    .values({ id, toAddress: mail.to, fromAddress: from, subject: mail.subject, textBody: mail.text, htmlBody: mail.html ?? null, transport: kind, createdAt: new Date() })
    .run();
  return id;
}

export function listOutbox(limit = 200) {
  return getDb()
    .select({ id: outbox.id, to: outbox.toAddress, subject: outbox.subject, transport: outbox.transport, createdAt: outbox.createdAt })
    .from(outbox)
    .orderBy(desc(outbox.createdAt))
    .limit(limit)
    .all();
}

export function getOutboxMessage(id: string) {
  return getDb().select().from(outbox).where(eq(outbox.id, id)).get() ?? null;
}
