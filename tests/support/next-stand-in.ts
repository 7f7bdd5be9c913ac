// The production server's request handler (src/server/platform/front-door.ts) in this process, with a
// stand-in for Next behind it: the stand-in turns Node's message into a Request, as Next does,
// and calls the real route handler for it. Tests see what reaches "Next" (`reached`) and can
// send raw HTTP to the server, declared lengths and chunked bodies included.
import http from "node:http";
import type { AddressInfo } from "node:net";
import { Readable } from "node:stream";
import { frontDoor } from "@/server/platform/front-door";

type RouteHandler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;
export type StandInRoute = { method: string; pattern: RegExp; handler: RouteHandler; params?: (match: RegExpExecArray) => Record<string, string> };

export async function startFrontDoor(routes: StandInRoute[]) {
  const reached: { method: string; url: string }[] = [];
  const next = (req: http.IncomingMessage, res: http.ServerResponse) => {
    reached.push({ method: req.method!, url: req.url! });
    void standIn(routes, req, res);
  };
  const door = frontDoor(next);
  const server = http.createServer(door.request);
  server.on("checkContinue", door.checkContinue);
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const port = (server.address() as AddressInfo).port;
  return { port, reached, close: () => new Promise<void>((r) => server.close(() => r())) };
}

async function standIn(routes: StandInRoute[], req: http.IncomingMessage, res: http.ServerResponse) {
  const pathname = req.url!.split("?")[0]!;
  for (const route of routes) {
    const match = route.method === req.method ? route.pattern.exec(pathname) : null;
    if (!match) continue;
    const headers = new Headers();
    for (const [name, value] of Object.entries(req.headers)) for (const one of [value ?? []].flat()) headers.append(name, one);
    const body = req.method === "GET" || req.method === "HEAD" ? undefined : (Readable.toWeb(req) as ReadableStream);
    const request = new Request(`http://${req.headers.host}${req.url}`, { method: req.method, headers, body, duplex: "half" } as RequestInit);
    const response = await route.handler(request, { params: Promise.resolve(route.params?.(match) ?? {}) });
    res.writeHead(response.status, Object.fromEntries(response.headers)).end(Buffer.from(await response.arrayBuffer()));
    return;
  }
  res.writeHead(200, { "content-type": "text/plain" }).end("a page Next would render");
}

export type RawAnswer = { status: number; headers: http.IncomingHttpHeaders; body: string; continued: boolean };

/**
 * Sends one request over a fresh socket. `body` is sent with a Content-Length, or in `chunks`
 * with Transfer-Encoding: chunked; `declared` claims a length without sending the bytes;
 * `expectContinue` sends the body only once the server says "100 Continue" (`continued`).
 * Resolves on the answer, even if the server closed the socket before taking the whole body.
 */
export function sendRaw(port: number, init: { method?: string; path: string; headers?: Record<string, string>; body?: Buffer; chunks?: Buffer[]; declared?: number; expectContinue?: boolean }): Promise<RawAnswer> {
  return new Promise((resolve, reject) => {
    // English unless a test says otherwise, as tests/support/api.ts: the tests compare with the English catalogue.
    const headers: Record<string, string> = { host: "localhost:3000", "accept-language": "en", ...init.headers };
    if (init.body) headers["content-length"] = String(init.body.length);
    if (init.declared !== undefined) headers["content-length"] = String(init.declared);
    if (init.chunks) headers["transfer-encoding"] = "chunked";
    if (init.expectContinue) headers.expect = "100-continue";
    let answered = false;
    let continued = false;
    const req = http.request({ host: "127.0.0.1", port, method: init.method ?? "POST", path: init.path, headers, agent: false }, (res) => {
      answered = true;
      const parts: Buffer[] = [];
      const done = () => {
        resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(parts).toString("utf8"), continued });
        req.destroy();
      };
      res.on("data", (c: Buffer) => parts.push(c));
      res.on("end", done);
      res.on("close", done);
    });
    // A server that answers early and closes may reset the socket under a body still being sent.
    req.on("error", (error) => (answered ? undefined : reject(error)));
    if (init.declared !== undefined) return void req.flushHeaders();
    if (init.expectContinue) {
      req.on("continue", () => ((continued = true), req.end(init.body)));
      return void req.flushHeaders();
    }
    if (init.chunks) {
      for (const chunk of init.chunks) req.write(chunk);
      return void req.end();
    }
    req.end(init.body);
  });
}
