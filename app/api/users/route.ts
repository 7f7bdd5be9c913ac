import { inviteSchema } from "@/lib/validation/people";
import { handle, readJson, requireApiPermission } from "@/server/platform/http";
import { publicOrigin } from "@/server/platform/public-origin";
import { inviteUser, listUsers } from "@/server/accounts/users";

export const GET = handle(async (request) => {
  await requireApiPermission(request, "users:manage");
  return Response.json({ items: listUsers() });
});

export const POST = handle(async (request, { t }) => {
  const actor = await requireApiPermission(request, "users:manage");
  const input = await readJson(request, inviteSchema, t);
  return Response.json(await inviteUser(actor, input, publicOrigin(), t), { status: 201 });
});
