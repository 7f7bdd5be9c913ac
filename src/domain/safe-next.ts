/**
 * Where to go after signing in: a path on this site, or nothing. An open redirect (a link to
 * our sign-in that ends on someone else's site) is the phishing tool OWASP's "Unvalidated
 * Redirects and Forwards" cheat sheet warns of, so only a same-origin relative path passes.
 * WHATWG URL: "//host" is protocol-relative, "\" counts as "/" in http(s) URLs ("/\host"), and
 * tabs and new lines are removed before parsing ("/\t/host"): each of these leaves our origin.
 */
const PLACEHOLDER = "http://grainline.invalid";
const MAX_LENGTH = 512;

export function safeNextPath(raw: unknown): string | null {
  if (typeof raw !== "string" || raw.length === 0 || raw.length > MAX_LENGTH) return null;
  if (!raw.startsWith("/") || /[\\\u0000-\u001f\u007f]/.test(raw) || raw.startsWith("//")) return null;
  let url: URL;
  try {
    url = new URL(raw, PLACEHOLDER);
  } catch {
    return null;
  }
  if (url.origin !== PLACEHOLDER) return null;
  // Back to the sign-in or sign-out page would go round in a circle.
  if (/^\/sign-(in|out)(\/|$)/.test(url.pathname)) return null;
  return `${url.pathname}${url.search}${url.hash}`;
}

/** The sign-in page with a destination to come back to (dropped when it is not one of ours). */
export function signInPath(next: string): string {
  const safe = safeNextPath(next);
  return safe ? `/sign-in?${new URLSearchParams({ next: safe }).toString()}` : "/sign-in";
}
