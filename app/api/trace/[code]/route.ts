import { z } from "zod";
import { normaliseLotCode } from "@/domain/lot-code";
import { handle, requireApiUser } from "@/server/platform/http";
import { invalid } from "@/server/platform/errors";
import { traceBackward, traceForward } from "@/server/trace/trace";

const direction = z.enum(["backward", "forward"]);

export const GET = handle(async (request, { params, t }) => {
  const actor = await requireApiUser(request);
  const parsed = direction.safeParse(new URL(request.url).searchParams.get("direction") ?? "backward");
  if (!parsed.success) throw invalid({ direction: [t("validation.oneOf", { options: "backward, forward" })] });
  const code = normaliseLotCode(params.code ?? "");
  return Response.json(parsed.data === "backward" ? traceBackward(actor, code) : traceForward(actor, code));
});
