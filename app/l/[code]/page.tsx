import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { isPhoneRequest } from "@/domain/device";
import { labelPagePath } from "@/domain/label-url";
import { normaliseLotCode } from "@/domain/lot-code";
import { can } from "@/domain/permissions";
import { requirePageUser, signInFirst } from "@/server/accounts/page-guard";

/**
 * What a label's QR code opens in the phone's own camera app: the floor card, with its next
 * steps, for someone who records on the floor and holds a phone; the office lot page
 * otherwise. Decided on the server from the request's client hint or User-Agent, so there is
 * no flash of the wrong page. A lot the reader may not see answers on either page exactly as
 * a code that does not exist.
 */
export default async function LabelPage({ params }: { params: Promise<{ code: string }> }) {
  const code = normaliseLotCode(decoded((await params).code));
  await signInFirst(labelPagePath(code));
  const user = await requirePageUser();
  const target = encodeURIComponent(code);
  if (can(user, "brewing:record") && isPhoneRequest(await headers())) redirect(`/scan?code=${target}`);
  redirect(`/lots/${target}`);
}

/** The segment as the lot page reads it; a malformed escape never reaches here (front-door answers 400). */
function decoded(segment: string): string {
  try {
    return decodeURIComponent(segment);
  } catch {
    return segment;
  }
}
