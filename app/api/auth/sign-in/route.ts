import { signInSchema } from "@/lib/validation/auth";
import { clientKey, handle, readJson } from "@/server/platform/http";
import { isHttps, sessionCookieHeader } from "@/server/accounts/session";
import { localeCookieHeader } from "@/server/accounts/locale-cookie";
import { signIn } from "@/server/accounts/users";

export const POST = handle(async (request, { t }) => {
  const input = await readJson(request, signInSchema, t);
  const { user, sessionToken, locale } = await signIn(input.email, input.password, clientKey(request));
  const headers = new Headers({ "Set-Cookie": sessionCookieHeader(sessionToken, isHttps(request)) });
  // A phone signing in through the API answers in the person's own language from then on.
  if (locale) headers.append("Set-Cookie", localeCookieHeader(locale, isHttps(request)));
  return Response.json({ user }, { headers });
});
