import { redirect } from "next/navigation";
import { HOME_FOR_ROLE } from "@/domain/permissions";
import { currentUser } from "@/server/accounts/session";

export default async function Root() {
  const user = await currentUser();
  redirect(user ? HOME_FOR_ROLE[user.role] : "/sign-in");
}
