"use client";

import { useRouter } from "next/navigation";

type Props = Omit<React.AnchorHTMLAttributes<HTMLAnchorElement>, "href"> & { href: string };

/**
 * The floor's links: a tap opens the next screen as next/link does, by a client navigation
 * (no full page load), but without next/link's code (about 4 kB gzip on every floor page, a
 * phone's first load). What the floor gives up is next/link's prefetch, which for these
 * pages (all dynamic, no loading.tsx) fetched next to nothing ahead. A click with a modifier
 * key, or on a link with a target or download, is left to the browser.
 */
export function FloorLink({ href, onClick, ...rest }: Props) {
  const router = useRouter();
  const open = (event: React.MouseEvent<HTMLAnchorElement>) => {
    onClick?.(event);
    if (event.defaultPrevented || event.button !== 0 || event.metaKey || event.ctrlKey || event.shiftKey || event.altKey) return;
    if ((rest.target && rest.target !== "_self") || rest.download !== undefined) return;
    event.preventDefault();
    router.push(href);
  };
  return <a href={href} onClick={open} {...rest} />;
}
