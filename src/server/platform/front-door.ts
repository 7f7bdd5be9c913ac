import "server-only";
import type { IncomingMessage, ServerResponse } from "node:http";
import { MAX_ATTACHMENT_BYTES } from "@/domain/file-kinds";
import { MAX_IMPORT_BYTES } from "@/lib/validation/csv";
import { MAX_BODY_BYTES } from "./body-limits";
import { PEER_HEADER } from "./client-address";
import type { ErrorMessage } from "./errors";
import { translatorFor } from "./http";
import { readCapped, withBody } from "./request-body";
import { SECURITY_HEADERS } from "./security-headers";

type Handler = (req: IncomingMessage, res: ServerResponse) => void;
type BodyLimit = { bytes: number; message: ErrorMessage; countsItself?: boolean };

const MiB = 1024 * 1024;
const DEFAULT_LIMIT: BodyLimit = { bytes: MAX_BODY_BYTES, message: { key: "errors.bodyTooLarge", values: { megabytes: MAX_BODY_BYTES / MiB } } };

/**
 * The two uploads allowed more than 1 MiB, each with its own documented limit. Attachments:
 * 10 MiB a file; the route checks the exact figure (form overhead included) and counts a
 * streamed body itself, so it is let through with a margin. Imports: a 2 MiB CSV file sent
 * as JSON cells, which the route bounds at four times the file (src/server/records/csv-import.ts).
 */
const LARGER_LIMITS: { method: string; pattern: RegExp; limit: BodyLimit }[] = [
  {
    method: "POST",
    pattern: /^\/api\/lots\/[^/]+\/attachments$/,
    limit: { bytes: MAX_ATTACHMENT_BYTES + MiB, message: { key: "errors.fileTooLarge", values: { megabytes: MAX_ATTACHMENT_BYTES / MiB } }, countsItself: true },
  },
  { method: "POST", pattern: /^\/api\/import\/(preview|commit)$/, limit: { bytes: MAX_IMPORT_BYTES * 4, message: { key: "csv.import.tooLarge" } } },
];

export function bodyLimitFor(method: string | undefined, pathname: string): BodyLimit {
  return LARGER_LIMITS.find((entry) => entry.method === method && entry.pattern.test(pathname))?.limit ?? DEFAULT_LIMIT;
}

/**
 * True when the path has a percent-escape that does not decode ("%zz", "%", a cut UTF-8
 * sequence): Next's router throws on these and answers a bare 500.
 */
export function malformedPath(pathname: string): boolean {
  try {
    decodeURIComponent(pathname);
    return false;
  } catch {
    return true;
  }
}

const pathOf = (req: IncomingMessage) => (req.url ?? "/").split("?", 1)[0]!;

/**
 * The production server's request handlers (src/cli/serve.ts): a malformed path is answered
 * 400 and a body over its limit 413, before anything reads the body; everything else goes to Next.
 * A streamed body is read here up to its limit first.
 * `checkContinue` takes Node's event of that name: a client that waits before sending its
 * body (Expect: 100-continue, as curl does for large ones) is told 413 instead of "go on".
 */
export function frontDoor(next: Handler) {
  const pass = (req: IncomingMessage, res: ServerResponse) => {
    // The socket's own peer, for sign-in throttling; whatever a client sent under this name is replaced.
    req.headers[PEER_HEADER] = req.socket.remoteAddress ?? "";
    next(req, res);
  };
  const handle = (req: IncomingMessage, res: ServerResponse, continueFirst: boolean) => {
    const pathname = pathOf(req);
    if (malformedPath(pathname)) return refuse(req, res, 400, "bad_request", { key: "errors.malformedAddress" });
    const limit = bodyLimitFor(req.method, pathname);
    // Node's parser has already refused a Content-Length that is not a plain number.
    if (Number(req.headers["content-length"] ?? 0) > limit.bytes) return refuse(req, res, 413, "too_large", limit.message);
    if (continueFirst) res.writeContinue();
    if (req.headers["transfer-encoding"] === undefined || limit.countsItself) return pass(req, res);
    readCapped(req, limit.bytes).then(
      (body) => (body ? pass(withBody(req, body), res) : refuse(req, res, 413, "too_large", limit.message)),
      () => res.destroy(), // the client went away mid-body: no one to answer
    );
  };
  return { request: (req: IncomingMessage, res: ServerResponse) => handle(req, res, false), checkContinue: (req: IncomingMessage, res: ServerResponse) => handle(req, res, true) };
}

/**
 * Answers with the site's security headers and closes the connection, so that Node does not
 * read the rest of an unread body to get at a next request (RFC 9112 §9.6).
 */
function refuse(req: IncomingMessage, res: ServerResponse, status: 400 | 413, code: string, message: ErrorMessage) {
  const said = translatorFor({ headers: { get: (name) => [req.headers[name.toLowerCase()] ?? []].flat().join(", ") || null } })(message.key, message.values);
  const api = pathOf(req).startsWith("/api/");
  const payload = api ? JSON.stringify({ error: { code, message: said } }) : `${said}\n`;
  const headers = [...SECURITY_HEADERS.flatMap(({ key, value }) => [key, value]), "Content-Type", api ? "application/json" : "text/plain; charset=utf-8"];
  res.writeHead(status, [...headers, "Content-Length", String(Buffer.byteLength(payload)), "Connection", "close"]).end(payload);
}
