import NextLink from "next/link";
import type { ComponentProps } from "react";

/**
 * `next/link` without prefetching, for every link of the app. Every page here is dynamic and
 * per person, so a prefetch is a server render (10–15 ms each, measured) of what a click asks
 * for anyway; an office page shows 20–45 links, each prefetched as it came into view, and the
 * router prefetched the header's again after hydration: 44 renders, about 0.5 s of the server's
 * time, for every page anyone opened. A click still navigates in the browser, without a reload.
 */
export default function Link(props: ComponentProps<typeof NextLink>) {
  return <NextLink prefetch={false} {...props} />;
}
