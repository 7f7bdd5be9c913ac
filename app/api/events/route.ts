import { eventSchema } from "@/lib/validation/events";
import { handle, idempotencyKeyOf, readJson, requireApiUser } from "@/server/http";
import { recordEvent } from "@/server/events";

export const POST = handle(async (request, { t }) => {
  const actor = await requireApiUser(request);
  const input = await readJson(request, eventSchema, t);
  const { status, body } = recordEvent(actor, input, t, idempotencyKeyOf(request));
  return Response.json(body, { status });
});
