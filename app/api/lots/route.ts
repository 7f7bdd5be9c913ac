import { z } from "zod";
import { LOT_SORTS, listLots } from "@/server/ledger/lots";
import { handle, requireApiUser } from "@/server/platform/http";
import { invalid } from "@/server/platform/errors";
import { fieldErrorsFrom } from "@/lib/validation/field-errors";

const querySchema = z.object({
  kind: z.string().max(20).optional(),
  q: z.string().max(40).optional(),
  variety: z.string().max(60).optional(),
  cropYear: z.coerce.number().int().min(2000).max(2100).optional(),
  partyId: z.string().max(64).optional(),
  grade: z.string().max(20).optional(),
  sort: z.enum(LOT_SORTS).optional(),
  dir: z.enum(["asc", "desc"]).optional(),
  limit: z.coerce.number().int().min(1).max(500).default(50),
  cursor: z.coerce.number().int().positive().optional(),
});

export const GET = handle(async (request, { t }) => {
  const actor = await requireApiUser(request);
  const parsed = querySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) throw invalid(fieldErrorsFrom(parsed.error, t));
  const { items, nextCursor } = listLots(actor, parsed.data);
  return Response.json({ items, nextCursor });
});
