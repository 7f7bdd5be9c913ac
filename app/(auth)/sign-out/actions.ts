"use server";

import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { lucia } from "@/server/auth";
import { currentUser, requestIsHttps } from "@/server/session";
import { signOut } from "@/server/users";

export async function signOutAction(): Promise<void> {
  const jar = await cookies();
  const sessionId = jar.get(lucia().sessionCookieName)?.value;
  const user = await currentUser();
  if (sessionId && user) await signOut(sessionId, user.id);
  const blank = lucia().createBlankSessionCookie();
  jar.set(blank.name, blank.value, { ...blank.attributes, secure: await requestIsHttps() });
  redirect("/sign-in");
}
