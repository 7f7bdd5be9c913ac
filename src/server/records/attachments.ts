import "server-only";
import { createHash, randomUUID } from "node:crypto";
import { mkdir, open, readFile, rename, rm, stat } from "node:fs/promises";
import path from "node:path";
import { and, desc, eq, inArray } from "drizzle-orm";
import { fileTypeFromBuffer } from "file-type";
import { z } from "zod";
import { attachments, eventInputs, eventOutputs, events, lots, measurements, users } from "@/db/schema";
import { isAttachmentType, kindOf, MAX_ATTACHMENT_BYTES, MAX_TITLE_LENGTH, safeFileName, type AttachmentKind } from "@/domain/file-kinds";
import { canAttachToLot } from "@/domain/permissions";
import { fieldErrorsFrom, type Translate } from "@/lib/validation/field-errors";
import { databaseFile, getDb } from "../platform/db";
import { AppError, forbidden, invalid, notFound, type FieldErrors } from "../platform/errors";
import { findLotId, visibleTo } from "../ledger/lots";
import type { SessionUser } from "../accounts/session";

export type AttachmentItem = {
  id: number;
  title: string;
  fileName: string;
  contentType: string;
  kind: AttachmentKind | null;
  size: number;
  eventId: number | null;
  userName: string;
  createdAt: string;
  href: string;
};

function visibleLot(actor: SessionUser, code: string) {
  const lot = getDb().select({ id: lots.id, partyId: lots.partyId, originPartyId: lots.originPartyId }).from(lots).where(and(eq(lots.code, code), visibleTo(actor))).get();
  if (!lot) throw notFound({ key: "errors.lotNotFound", values: { code } });
  return lot;
}

/** 413 (RFC 9110 §15.5.14) in the API's error shape. */
const uploadTooLarge = () => new AppError("too_large", { key: "errors.fileTooLarge", values: { megabytes: MAX_ATTACHMENT_BYTES / (1024 * 1024) } });

// Room for the multipart boundaries, headers, title and event id around the file itself.
const FORM_OVERHEAD_BYTES = 64 * 1024;

/**
 * Reads a multipart body without ever holding more than the limit: a declared
 * Content-Length over it is refused unread, and reading stops at the first byte past it.
 */
async function readLimitedForm(request: Request, t: Translate): Promise<FormData> {
  const limit = MAX_ATTACHMENT_BYTES + FORM_OVERHEAD_BYTES;
  if (Number(request.headers.get("content-length") ?? 0) > limit) throw uploadTooLarge();
  const type = request.headers.get("content-type") ?? "";
  if (!/^multipart\/form-data\s*;/i.test(type) || !request.body) throw invalid({ file: [t("attachments.notMultipart")] });
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (let next = await reader.read(); !next.done; next = await reader.read()) {
    total += next.value.byteLength;
    if (total > limit) {
      await reader.cancel();
      throw uploadTooLarge();
    }
    chunks.push(next.value);
  }
  try {
    return await new Response(Buffer.concat(chunks), { headers: { "content-type": type } }).formData();
  } catch {
    throw invalid({ file: [t("attachments.notMultipart")] });
  }
}

/** GRAINLINE_FILES, else a "files" folder beside the SQLite database. */
export function filesDir(): string {
  return process.env.GRAINLINE_FILES || path.join(path.dirname(databaseFile()), "files");
}

/** Content-addressed: <dir>/<first two hex digits>/<sha256>, so one folder never holds them all. */
export function blobPath(sha256: string): string {
  if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error("not a SHA-256 hex digest");
  return path.join(filesDir(), sha256.slice(0, 2), sha256);
}

/**
 * Writes the bytes once per content: to a temporary file in the same folder, flushed, then
 * renamed into place, so a reader never sees half a file even if the process dies mid-write.
 */
async function storeBlob(sha256: string, bytes: Uint8Array): Promise<void> {
  const target = blobPath(sha256);
  if ((await stat(target).catch(() => null))?.size === bytes.byteLength) return;
  await mkdir(path.dirname(target), { recursive: true });
  const temp = path.join(path.dirname(target), `.${sha256}.${randomUUID()}.part`);
  try {
    const file = await open(temp, "wx", 0o640);
    try {
      await file.writeFile(bytes);
      await file.sync();
    } finally {
      await file.close();
    }
    await rename(temp, target);
  } catch (error) {
    await rm(temp, { force: true });
    throw error;
  }
}

const metaSchema = z.object({
  title: z.string().trim().max(MAX_TITLE_LENGTH).default(""),
  eventId: z.preprocess((v) => (v === "" ? undefined : v), z.coerce.number().int().positive().optional()),
});

/** True when the event drew from, added to, moved or measured the lot, or corrected one that did. */
function eventTouchesLot(eventId: number, lotId: number): boolean {
  const db = getDb();
  const touching = db
    .select({ id: eventInputs.eventId }).from(eventInputs).where(eq(eventInputs.lotId, lotId))
    .union(db.select({ id: eventOutputs.eventId }).from(eventOutputs).where(eq(eventOutputs.lotId, lotId)))
    .union(db.select({ id: measurements.eventId }).from(measurements).where(eq(measurements.lotId, lotId)))
    .all()
    .map((r) => r.id);
  if (touching.includes(eventId)) return true;
  return Boolean(touching.length && db.select({ id: events.id }).from(events).where(and(eq(events.id, eventId), inArray(events.corrects, touching))).get());
}

/**
 * Takes a multipart upload (`file`, optional `title`, `eventId`) for a lot: the type is
 * what the bytes are, the blob is written (atomically, once per content) before its row.
 */
export async function addAttachment(actor: SessionUser, code: string, request: Request, t: Translate) {
  const lot = visibleLot(actor, code);
  if (!canAttachToLot(actor, lot)) throw forbidden();
  const form = await readLimitedForm(request, t);
  const file = form.get("file");
  if (file instanceof File && file.size > MAX_ATTACHMENT_BYTES) throw uploadTooLarge();

  const errors: FieldErrors = {};
  const meta = metaSchema.safeParse({ title: form.get("title") ?? undefined, eventId: form.get("eventId") ?? undefined });
  if (!meta.success) Object.assign(errors, fieldErrorsFrom(meta.error, t));
  else if (meta.data.eventId !== undefined && !eventTouchesLot(meta.data.eventId, lot.id)) errors.eventId = [t("attachments.eventNotOnLot")];

  let bytes = new Uint8Array();
  let contentType: string | undefined;
  // A form sent with no file chosen carries an empty part with an empty name.
  if (!(file instanceof File) || (file.size === 0 && file.name === "")) errors.file = [t("validation.required")];
  else if (file.size === 0) errors.file = [t("attachments.emptyFile")];
  else {
    bytes = new Uint8Array(await file.arrayBuffer());
    contentType = (await fileTypeFromBuffer(bytes))?.mime;
    if (!isAttachmentType(contentType)) errors.file = [t("attachments.unsupported")];
  }
  if (Object.keys(errors).length || !meta.success || !isAttachmentType(contentType)) throw invalid(errors);

  const sha256 = createHash("sha256").update(bytes).digest("hex");
  await storeBlob(sha256, bytes);
  const row = getDb()
    .insert(attachments)
    .values({
      lotId: lot.id,
      eventId: meta.data.eventId ?? null,
      sha256,
      fileName: safeFileName((file as File).name, contentType),
      contentType,
      size: bytes.byteLength,
      title: meta.data.title,
      userId: actor.id,
      createdAt: new Date(),
    })
    .returning({ id: attachments.id })
    .get();
  return { id: row.id, sha256, contentType, size: bytes.byteLength };
}

/** A lot's attachments, newest first; 404 for a lot the user may not see. */
export function listAttachments(actor: SessionUser, code: string): AttachmentItem[] {
  const lotId = findLotId(actor, code);
  if (lotId === null) throw notFound({ key: "errors.lotNotFound", values: { code } });
  return getDb()
    .select({ a: attachments, userName: users.name })
    .from(attachments)
    .innerJoin(users, eq(users.id, attachments.userId))
    .where(eq(attachments.lotId, lotId))
    .orderBy(desc(attachments.createdAt), desc(attachments.id))
    .all()
    .map(({ a, userName }) => ({
      id: a.id,
      title: a.title,
      fileName: a.fileName,
      contentType: a.contentType,
      kind: kindOf(a.contentType),
      size: a.size,
      eventId: a.eventId,
      userName,
      createdAt: a.createdAt.toISOString(),
      href: `/api/attachments/${a.id}`,
    }));
}

/** What the lot page's panel needs. */
export function lotAttachments(actor: SessionUser, code: string): { canUpload: boolean; items: AttachmentItem[] } {
  const items = listAttachments(actor, code);
  return { canUpload: canAttachToLot(actor, visibleLot(actor, code)), items };
}

/** One attachment's bytes, for users who may see its lot; anyone else gets 404. */
export async function readAttachment(actor: SessionUser, id: number) {
  const row = getDb()
    .select({ sha256: attachments.sha256, fileName: attachments.fileName, contentType: attachments.contentType })
    .from(attachments)
    .innerJoin(lots, eq(lots.id, attachments.lotId))
    .where(and(eq(attachments.id, id), visibleTo(actor)))
    .get();
  if (!row) throw notFound("errors.attachmentNotFound");
  return { ...row, bytes: await readFile(blobPath(row.sha256)) };
}
