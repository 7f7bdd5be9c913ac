/**
 * Whether a request comes from a phone, for the one address a label's QR code carries: the
 * floor card on a phone, the office lot page on a desk. Chromium browsers send the
 * low-entropy client hint `Sec-CH-UA-Mobile` (?1 / ?0, User-Agent Client Hints, WICG) on
 * every request; without it (Safari, Firefox), MDN's advice on User-Agent sniffing: "Mobi"
 * anywhere in the User-Agent means a mobile device. A tablet says neither and gets the desk.
 */
export function isPhoneRequest(headers: { get(name: string): string | null }): boolean {
  const hint = headers.get("sec-ch-ua-mobile")?.trim();
  if (hint === "?1") return true;
  if (hint === "?0") return false;
  return /Mobi/.test(headers.get("user-agent") ?? "");
}
