import { fieldSchema } from "@/lib/validation/fields";
import { handle, readJson, requireApiUser } from "@/server/http";
import { createField, listFields } from "@/server/fields";

export const GET = handle(async (request) => {
  const actor = await requireApiUser(request);
  const items = listFields(actor).map(({ id, name, region, areaHa, growerId }) => ({ id, name, region, areaHa, growerId }));
  return Response.json({ items });
});

export const POST = handle(async (request, { t }) => {
  const actor = await requireApiUser(request);
  const input = await readJson(request, fieldSchema, t);
  return Response.json(createField(actor, input, t), { status: 201 });
});
