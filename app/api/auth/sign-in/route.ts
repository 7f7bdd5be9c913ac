import { signInSchema } from "@/lib/validation/auth";
import { clientKey, handle, readJson } from "@/server/http";
import { isHttps, sessionCookieHeader } from "@/server/session";
import { signIn } from "@/server/users";

export const POST = handle(async (request, { t }) => {
  const input = await readJson(request, signInSchema, t);
  const { user, sessionToken } = await signIn(input.email, input.password, clientKey(request));
  return Response.json({ user }, { headers: { "Set-Cookie": sessionCookieHeader(sessionToken, isHttps(request)) } });
});
