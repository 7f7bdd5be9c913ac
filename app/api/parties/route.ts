import { partySchema } from "@/lib/validation/people";
import { handle, readJson, requireApiPermission } from "@/server/platform/http";
import { createParty, listParties } from "@/server/ledger/parties";

export const GET = handle(async (request) => {
  await requireApiPermission(request, "parties:manage");
  return Response.json({ items: listParties() });
});

export const POST = handle(async (request, { t }) => {
  const actor = await requireApiPermission(request, "parties:manage");
  const input = await readJson(request, partySchema, t);
  return Response.json(createParty(actor, input), { status: 201 });
});
