import { getTranslations } from "next-intl/server";
import { OFFICE_NAV } from "@/components/nav-items";
import type { Actor } from "@/domain/permissions";
import { FloorLink } from "./floor-link";

/**
 * The phone menu: the office screens a brewer reaches from the floor (bags arriving, the day's
 * brewing), each shown only to roles the server lets through (the office nav's own rules).
 */
const FLOOR_MENU = ["/receive", "/brew-days", "/lots"];

export async function FloorNav({ actor }: { actor: Actor }) {
  const t = await getTranslations("nav");
  const items = FLOOR_MENU.map((href) => OFFICE_NAV.find((item) => item.href === href)!).filter((item) => item.show(actor));
  return (
    <nav aria-label={t("floorMenu")} className="border-b-2 border-cedar px-2">
      <ul className="mx-auto flex max-w-xl gap-1 overflow-x-auto">
        {items.map((item) => (
          <li key={item.href}>
            <FloorLink href={item.href} className="flex min-h-12 items-center whitespace-nowrap rounded px-3 text-lg font-semibold text-paper hover:bg-cedar">
              {t(item.label)}
            </FloorLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
