import "server-only";
import type { IncomingMessage, ServerResponse } from "node:http";
import * as eventsRoute from "../../../app/api/events/route";
import * as lotRoute from "../../../app/api/lots/[code]/route";
import { AppError } from "./errors";
import { errorReply, translatorFor, type ApiRequest, type JsonReply, type JsonRoute } from "./http";
import { SECURITY_HEADERS } from "./security-headers";
import { inTurn } from "./turns";

/** `params` decodes the route's parameters, as Next gives them; it throws on a malformed escape. */
type FastRoute = { method: string; pattern: RegExp; route: JsonRoute; params: (match: RegExpExecArray) => Record<string, string> };

/**
 * The floor's two busiest calls — a phone looking up a scanned lot, and a phone recording a
 * step — answered by their own route handlers (the `run` of the same exports Next calls)
 * ahead of Next's router, which costs about 0.8 ms a request on its own (`npm run
 * bench:load`). Everything else, and any request these entries leave alone, goes to Next.
 */
export const FAST_ROUTES: readonly FastRoute[] = [
  { method: "GET", pattern: /^\/api\/lots\/([^/]+)$/, route: lotRoute.GET, params: (m) => ({ code: decodeURIComponent(m[1]!) }) },
  { method: "POST", pattern: /^\/api\/events$/, route: eventsRoute.POST, params: () => ({}) },
];

/** Bodies above this size, and streamed bodies, are left to Next. An event is a few hundred bytes. */
export const FAST_PATH_MAX_BODY = 64 * 1024;

/** Name, value, name, value…: the form of headers Node writes with the least work. */
const FIXED_HEADERS: readonly string[] = [...SECURITY_HEADERS.flatMap(({ key, value }) => [key, value]), "Content-Type", "application/json"];

/** Answers the request if a fast route matches it; false leaves it to Next. */
export function serveFast(req: IncomingMessage, res: ServerResponse): boolean {
  const url = req.url ?? "/";
  const query = url.indexOf("?");
  const pathname = query === -1 ? url : url.slice(0, query);
  for (const entry of FAST_ROUTES) {
    if (req.method !== entry.method) continue;
    const match = entry.pattern.exec(pathname);
    if (!match) continue;
    let params: Record<string, string>;
    try {
      params = entry.params(match);
    } catch {
      return false; // a malformed escape is Next's to answer
    }
    if (req.method !== "GET" && (req.headers["transfer-encoding"] !== undefined || !(Number(req.headers["content-length"] ?? 0) <= FAST_PATH_MAX_BODY))) return false;
    inTurn(() =>
      respond(req, res, entry.route, params).catch((error: unknown) => {
        // Only writing the reply itself can fail here; the socket is closed rather than left hanging.
        console.error(error);
        res.destroy();
      }),
    );
    return true;
  }
  return false;
}

/** The whole body; rejects if the client goes away first, even while the request waited its turn. */
export function readBody(req: IncomingMessage): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    if (req.destroyed) return reject(new Error("the request was closed before its body was read"));
    req.on("close", () => {
      if (!req.readableEnded) reject(new Error("the request was closed before its body was read"));
    });
    const chunks: Buffer[] = [];
    let size = 0;
    req.on("data", (chunk: Buffer) => {
      size += chunk.length;
      if (size > FAST_PATH_MAX_BODY) req.destroy(new Error("body larger than its Content-Length"));
      else chunks.push(chunk);
    });
    req.on("end", () => resolve(Buffer.concat(chunks)));
    req.on("error", reject);
  });
}

const utf8 = new TextDecoder();

/**
 * The request as a JSON route reads it, straight from Node's parsed message. A class, not an
 * object of closures: one is made for every request on the floor's busiest calls.
 */
class NodeApiRequest implements ApiRequest {
  readonly headers: ApiRequest["headers"];
  constructor(
    private readonly req: IncomingMessage,
    private readonly body: Buffer | null,
  ) {
    this.headers = new NodeHeaders(req);
  }
  get method() {
    return this.req.method!;
  }
  get url() {
    return `http://${this.req.headers.host ?? "localhost"}${this.req.url}`;
  }
  // Like Request.json(): UTF-8 without a leading BOM; a missing or malformed body rejects.
  async json() {
    return JSON.parse(utf8.decode(this.body ?? undefined));
  }
}

class NodeHeaders {
  constructor(private readonly req: IncomingMessage) {}
  get(name: string): string | null {
    const value = this.req.headers[name.toLowerCase()];
    return value === undefined ? null : Array.isArray(value) ? value.join(", ") : value;
  }
}

async function respond(req: IncomingMessage, res: ServerResponse, route: JsonRoute, params: Record<string, string>) {
  let result: JsonReply;
  try {
    const body = req.method === "GET" ? null : await readBody(req);
    result = await route.run(new NodeApiRequest(req, body), params);
  } catch (error) {
    if (req.destroyed) return;
    // `run` answers its own errors; this is a body that could not be read at all.
    result = errorReply(new AppError("invalid", "errors.unreadable"), translatorFor(new NodeApiRequest(req, null)));
    console.error(error);
  }
  const payload = JSON.stringify(result.body);
  res.writeHead(result.status, [...FIXED_HEADERS, "Content-Length", String(Buffer.byteLength(payload))]).end(payload);
}
