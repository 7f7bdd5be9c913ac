import { handle } from "@/server/platform/http";
import { blankSessionCookieHeader, isHttps, sessionFromRequest } from "@/server/accounts/session";
import { signOut } from "@/server/accounts/users";

export const POST = handle(async (request) => {
  const found = await sessionFromRequest(request);
  if (found) await signOut(found.session.id, found.user.id);
  return new Response(null, { status: 204, headers: { "Set-Cookie": blankSessionCookieHeader(isHttps(request)) } });
});
