"use server";

import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { lucia } from "@/server/accounts/auth";
import { currentUser, requestIsHttps } from "@/server/accounts/session";
import { sessionIdFor } from "@/server/accounts/session-token";
import { signOut } from "@/server/accounts/users";

export async function signOutAction(): Promise<void> {
  const jar = await cookies();
  const token = jar.get(lucia().sessionCookieName)?.value;
  const user = await currentUser();
  if (token && user) await signOut(sessionIdFor(token), user.id);
  const blank = lucia().createBlankSessionCookie();
  jar.set(blank.name, blank.value, { ...blank.attributes, secure: await requestIsHttps() });
  redirect("/sign-in");
}
