import { normaliseLotCode } from "@/domain/lot-code";
import { addAttachment, listAttachments } from "@/server/records/attachments";
import { handle, requireApiUser } from "@/server/platform/http";

export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  return Response.json({ items: listAttachments(actor, normaliseLotCode(params.code ?? "")) });
});

export const POST = handle(async (request, { params, t }) => {
  const actor = await requireApiUser(request);
  return Response.json(await addAttachment(actor, normaliseLotCode(params.code ?? ""), request, t), { status: 201 });
});
