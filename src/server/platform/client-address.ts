/** The header the production server (src/cli/serve.ts) writes the socket's peer address into. */
export const PEER_HEADER = "x-grainline-peer";

/**
 * The address sign-in throttling counts failures against.
 * - Behind a reverse proxy (GRAINLINE_TRUST_PROXY=1): the last X-Forwarded-For entry, the
 *   address the proxy itself saw. A client can put anything before it, nothing after it.
 * - Otherwise: the socket's peer, as src/cli/serve.ts records it (replacing any such header
 *   the client sent). X-Forwarded-For is ignored then: anyone can send it.
 * "local" when neither is there (`next dev`).
 */
export function clientAddress(headers: { get(name: string): string | null }, trustProxy = process.env.GRAINLINE_TRUST_PROXY === "1"): string {
  if (trustProxy) {
    const last = headers.get("x-forwarded-for")?.split(",").pop()?.trim();
    if (last) return last;
  }
  return headers.get(PEER_HEADER)?.trim() || "local";
}
