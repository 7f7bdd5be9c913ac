import { contentDisposition, isAttachmentType } from "@/domain/file-kinds";
import { readAttachment } from "@/server/records/attachments";
import { notFound } from "@/server/platform/errors";
import { handle, requireApiUser } from "@/server/platform/http";

export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  const id = /^[1-9]\d{0,15}$/.test(params.id ?? "") ? Number(params.id) : null;
  if (id === null) throw notFound("errors.attachmentNotFound");
  const file = await readAttachment(actor, id);
  // Stored types were sniffed on upload; anything else would mean a row written by hand.
  const type = isAttachmentType(file.contentType) ? file.contentType : null;
  return new Response(new Uint8Array(file.bytes), {
    headers: {
      "Content-Type": type ?? "application/octet-stream",
      "Content-Length": String(file.bytes.byteLength),
      "Content-Disposition": type ? contentDisposition(file.fileName, type) : "attachment",
      "X-Content-Type-Options": "nosniff",
      "Cache-Control": "private",
    },
  });
});
