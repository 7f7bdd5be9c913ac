import { normaliseLotCode } from "@/domain/lot-code";
import { handle, requireApiUser } from "@/server/platform/http";
import { publicOrigin } from "@/server/platform/public-origin";
import { renderLabelPng } from "@/server/floor/labels";

export const GET = handle(async (request, { params }) => {
  const actor = await requireApiUser(request);
  const code = normaliseLotCode(params.code ?? "");
  const png = await renderLabelPng(actor, code, publicOrigin());
  return new Response(new Uint8Array(png), {
    headers: {
      "Content-Type": "image/png",
      // Only for this signed-in user: shared caches must not hand one party's label to another.
      "Cache-Control": "private, max-age=300",
      "Content-Disposition": `inline; filename="label-${encodeURIComponent(code)}.png"`,
    },
  });
});
