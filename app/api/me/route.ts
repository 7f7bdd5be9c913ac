import { handle, requireApiUser } from "@/server/platform/http";

export const GET = handle(async (request) => {
  const { id, email, name, role, partyId } = await requireApiUser(request);
  return Response.json({ id, email, name, role, partyId });
});
