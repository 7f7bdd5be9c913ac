import "server-only";
import { forbidden, redirect } from "next/navigation";
import { can, type Permission } from "@/domain/permissions";
import { signInPath } from "@/domain/safe-next";
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

/** For an address reached from outside (a label's QR code): no session → sign-in, then back here. */
export async function signInFirst(next: string): Promise<void> {
  if (!(await currentUser())) redirect(signInPath(next));
}
