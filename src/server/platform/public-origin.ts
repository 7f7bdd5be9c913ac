import "server-only";

/**
 * The one answer to "where is this Grainline reached from outside?": the origin of every link
 * Grainline writes (set-password and invitation e-mails, statement e-mails, label QR codes).
 *
 * It never comes from the request. Host and X-Forwarded-Host are whatever the client (or a
 * proxy that passes them through) sent, and a reset link built from them would carry the
 * token to the sender's server. So: GRAINLINE_ORIGIN when set, otherwise the address
 * `npm start` prints, http://localhost:PORT. GRAINLINE_TRUST_PROXY does not change this:
 * behind a reverse proxy, set GRAINLINE_ORIGIN to the address people type.
 */
export function publicOrigin(env: Record<string, string | undefined> = process.env): string {
  const configured = env.GRAINLINE_ORIGIN?.trim();
  if (!configured) return `http://localhost:${env.PORT || 3000}`;
  let url: URL;
  try {
    url = new URL(configured);
  } catch {
    throw new Error(`GRAINLINE_ORIGIN is not an address: ${configured}`);
  }
  if (url.protocol !== "https:" && url.protocol !== "http:") throw new Error(`GRAINLINE_ORIGIN must be an http or https address: ${configured}`);
  // Only scheme, host and port: Grainline is served from the root of its origin.
  return url.origin;
}

export function publicOriginIsHttps(env: Record<string, string | undefined> = process.env): boolean {
  return publicOrigin(env).startsWith("https:");
}

/**
 * Strict-Transport-Security (RFC 6797) for a site served over https: one year, the usual
 * value (common practice). Never on plain http — RFC 6797 §7.2 forbids sending it there, and
 * pinning `localhost` to https would break every other local app on the machine.
 * Subdomains are left out: the brewery's other hosts are not ours to pin.
 */
export function transportSecurityHeaders(env: Record<string, string | undefined> = process.env): [string, string][] {
  return publicOriginIsHttps(env) ? [["Strict-Transport-Security", "max-age=31536000"]] : [];
}
