import { fieldApiSchema } from "@/lib/validation/fields";
import { can } from "@/domain/permissions";
import { forbidden } from "@/server/platform/errors";
import { handle, readJson, requireApiUser } from "@/server/platform/http";
import { createField, listFields } from "@/server/ledger/fields";

export const GET = handle(async (request) => {
  const actor = await requireApiUser(request);
  const items = listFields(actor).map(({ id, name, region, areaHa, growerId }) => ({ id, name, region, areaHa, growerId }));
  return Response.json({ items });
});

export const POST = handle(async (request, { t }) => {
  const actor = await requireApiUser(request);
  if (!can(actor, "fields:write-own") && !can(actor, "fields:write-any")) throw forbidden();
  const input = await readJson(request, fieldApiSchema, t);
  return Response.json(createField(actor, input, t), { status: 201 });
});
