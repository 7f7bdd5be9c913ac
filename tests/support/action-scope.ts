// Server actions read the session through next/headers and their messages through next-intl; outside
// Next.js both need a request scope. A test file mocks those modules with these stand-ins, whose
// cookie is that of whoever is acting:
//   vi.mock("next/headers", async () => (await import("./action-scope")).nextHeaders);
//   vi.mock("next/cache", async () => (await import("./action-scope")).nextCache);
//   vi.mock("next-intl/server", async () => (await import("./action-scope")).nextIntlServer());
import { translator } from "@/i18n/messages";
import { initialFormState, type FormState } from "@/lib/form-state";

/** The request scope the stand-ins read: set by `submit` for the length of one call. */
export const scope = { cookie: "", headers: {} as Record<string, string> };

export const nextHeaders = {
  cookies: async () => ({
    get: (name: string) => {
      const [key, ...value] = scope.cookie.split("=");
      return key === name ? { name, value: value.join("=") } : undefined;
    },
    set: () => undefined,
  }),
  headers: async () => new Headers({ host: "localhost:3000", ...scope.headers }),
};

export const nextCache = { revalidatePath: () => undefined, revalidateTag: () => undefined };

export async function nextIntlServer() {
  const t = translator("en");
  return { getTranslations: async () => (key: string, values?: Record<string, unknown>) => t(key as never, values as never), getLocale: async () => "en" };
}

export type Action = (state: FormState, form: FormData) => Promise<FormState | void>;

/**
 * Submits a form to an action as the browser would, signed in with `cookie` ("" for nobody),
 * with any further request `headers` (a forged Host, the peer address): the state it answers,
 * or where it redirects.
 */
export async function submit(cookie: string, action: Action, form: Record<string, string> | [string, string][], headers: Record<string, string> = {}): Promise<{ state: FormState } | { redirect: string }> {
  const data = new FormData();
  for (const [k, v] of Array.isArray(form) ? form : Object.entries(form)) data.append(k, v);
  scope.cookie = cookie;
  scope.headers = headers;
  try {
    return { state: (await action(initialFormState, data)) ?? {} };
  } catch (error) {
    const digest = (error as { digest?: unknown }).digest;
    if (typeof digest === "string" && digest.startsWith("NEXT_REDIRECT;")) return { redirect: digest.split(";")[2]! };
    throw error;
  } finally {
    scope.cookie = "";
    scope.headers = {};
  }
}
