import { can } from "@/domain/permissions";
import { harvestSchema } from "@/lib/validation/events";
import { forbidden } from "@/server/platform/errors";
import { handle, idempotencyKeyOf, readJson, requireApiUser } from "@/server/platform/http";
import { registerHarvest } from "@/server/ledger/harvests";

export const POST = handle(async (request, { t }) => {
  const actor = await requireApiUser(request);
  if (!can(actor, "harvests:record-own") && !can(actor, "harvests:record-any")) throw forbidden();
  const input = await readJson(request, harvestSchema, t);
  const { status, body } = registerHarvest(actor, input, t, idempotencyKeyOf(request));
  return Response.json(body, { status });
});
