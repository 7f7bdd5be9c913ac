import { getRequestConfig } from "next-intl/server";
import { cookies, headers } from "next/headers";
import { currentUser } from "@/server/accounts/session";
import { breweryTimeZone } from "@/server/platform/settings";
import { DATE_FORMATS } from "./dates";
import { LOCALE_COOKIE, pickLocale } from "./locale";
import { loadMessages } from "./messages";

export default getRequestConfig(async () => {
  // currentUser is cached per request: the layout's own session read is the one read here.
  const user = await currentUser();
  const locale = pickLocale((await cookies()).get(LOCALE_COOKIE)?.value, (await headers()).get("accept-language"), user?.locale);
  // Named date formats (`format.dateTime(d, "day")`) and the brewery's clock, shared with PDFs and CSV (./dates.ts).
  return { locale, messages: loadMessages(locale), timeZone: breweryTimeZone(), formats: { dateTime: DATE_FORMATS[locale] } };
});
