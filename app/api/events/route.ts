import { canRecordEvents } from "@/domain/permissions";
import { eventSchema } from "@/lib/validation/events";
import { forbidden } from "@/server/platform/errors";
import { idempotencyKeyOf, jsonRoute, readJson, reply, requireApiUser } from "@/server/platform/http";
import { recordEvent } from "@/server/ledger/events";

export const POST = jsonRoute(async (request, { t }) => {
  const actor = await requireApiUser(request);
  if (!canRecordEvents(actor)) throw forbidden();
  const input = await readJson(request, eventSchema, t);
  const { status, body } = recordEvent(actor, input, t, idempotencyKeyOf(request));
  return reply(body, status);
});
