// The production server's fast path in this process: a node:http server that answers what
// serveFast takes and 404s the rest, and a Request → Response adapter that sends a Request
// to it over a real socket (keeping its Host header, which fetch would replace).
import http from "node:http";
import type { AddressInfo } from "node:net";
import { serveFast } from "@/server/platform/fast-path";

export const LEFT_TO_NEXT = 599;

export async function startFastPathServer() {
  const server = http.createServer((req, res) => {
    if (!serveFast(req, res)) res.writeHead(LEFT_TO_NEXT).end();
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const port = (server.address() as AddressInfo).port;

  /** Sends the Request through the fast path; a 599 means serveFast left it to Next. */
  async function send(request: Request, extraHeaders: Record<string, string> = {}): Promise<Response> {
    const url = new URL(request.url);
    const body = request.body ? Buffer.from(await request.arrayBuffer()) : null;
    const headers: Record<string, string> = { ...Object.fromEntries(request.headers), ...extraHeaders };
    if (body && !("transfer-encoding" in headers)) headers["content-length"] = String(body.length);
    return new Promise((resolve, reject) => {
      const req = http.request({ host: "127.0.0.1", port, method: request.method, path: url.pathname + url.search, headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => {
          const out = new Headers();
          for (const [k, v] of Object.entries(res.headers)) for (const one of [v].flat()) if (one !== undefined) out.append(k, one);
          resolve(new Response(res.statusCode === 204 ? null : Buffer.concat(chunks), { status: res.statusCode, headers: out }));
        });
        res.on("error", reject);
      });
      req.on("error", reject);
      req.end(body ?? undefined);
    });
  }

  /** The fast path in the shape of a route handler (for tests written against route handlers). */
  const asHandler = (request: Request) => send(request);

  return { port, send, asHandler, close: () => new Promise<void>((r) => server.close(() => r())) };
}
