import "server-only";
import { forbidden, redirect } from "next/navigation";
import { can, type Permission } from "@/domain/permissions";
import { currentUser, type SessionUser } from "./session";

/** For pages: no session → sign-in; a role without the permission → 403 page. */
export async function requirePagePermission(permission: Permission): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  if (!can(user, permission)) forbidden();
  return user;
}

export async function requirePageUser(): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  return user;
}
