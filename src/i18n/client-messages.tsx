import { NextIntlClientProvider } from "next-intl";
import { getMessages } from "next-intl/server";
import type { Messages } from "./messages";

export type Namespace = keyof Messages;

/**
 * Hands the client components below only the catalogue namespaces they read. The whole catalogue
 * is about 86 kB of every page's HTML, serialised and escaped on every request; a page's client
 * components read a few kB of it. Each layout and page names its namespaces, and
 * src/i18n/client-namespaces.test.ts holds each list equal to what its client components read.
 * A nested provider replaces the one above it: a page's list covers the page's client components.
 */
export async function ClientMessages({ namespaces, children }: { namespaces: readonly Namespace[]; children: React.ReactNode }) {
  const all = (await getMessages()) as Messages;
  const picked: Partial<Messages> = {};
  for (const name of namespaces) Object.assign(picked, { [name]: all[name] });
  return <NextIntlClientProvider messages={picked}>{children}</NextIntlClientProvider>;
}

/** A page whose client components read `namespaces`: `export default withClientMessages(["lot"], LotPage)`. */
export function withClientMessages<P extends object>(namespaces: readonly Namespace[], Page: (props: P) => Promise<React.ReactNode> | React.ReactNode) {
  return async function PageWithMessages(props: P) {
    return (
      <ClientMessages namespaces={namespaces}>
        <Page {...props} />
      </ClientMessages>
    );
  };
}
