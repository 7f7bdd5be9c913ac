import { inviteSchema } from "@/lib/validation/people";
import { appOrigin, handle, readJson, requireApiPermission } from "@/server/http";
import { inviteUser, listUsers } from "@/server/users";

export const GET = handle(async (request) => {
  await requireApiPermission(request, "users:manage");
  return Response.json({ items: listUsers() });
});

export const POST = handle(async (request, { t }) => {
  const actor = await requireApiPermission(request, "users:manage");
  const input = await readJson(request, inviteSchema, t);
  return Response.json(await inviteUser(actor, input, appOrigin(request), t), { status: 201 });
});
