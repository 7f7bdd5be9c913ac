import "server-only";
import { IncomingMessage } from "node:http";

/**
 * Reads a body that came without a Content-Length (chunked), counting as it goes: resolves
 * with the bytes, or with null as soon as it passes `limit` — reading stops there, at most
 * one chunk past it, and the connection is to be closed by the answer.
 */
export function readCapped(req: IncomingMessage, limit: number): Promise<Buffer | null> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    const onData = (chunk: Buffer) => {
      size += chunk.length;
      if (size <= limit) return void chunks.push(chunk);
      req.pause();
      req.off("data", onData);
      resolve(null);
    };
    req.on("data", onData);
    req.on("end", () => resolve(Buffer.concat(chunks)));
    req.on("error", reject);
    req.on("close", () => {
      if (!req.readableEnded) reject(new Error("the request was closed before its body was read"));
    });
  });
}

/** A request already read, handed on with its bytes; nothing more comes from the socket for it. */
class ReadRequest extends IncomingMessage {
  override _read() {}
}

/**
 * The same request with the body read by `readCapped`, as one with a Content-Length: Next
 * then reads it as it reads any other.
 */
export function withBody(req: IncomingMessage, body: Buffer): IncomingMessage {
  const copy = new ReadRequest(req.socket);
  const headers = { ...req.headers, "content-length": String(body.length) };
  delete headers["transfer-encoding"];
  Object.assign(copy, {
    method: req.method,
    url: req.url,
    httpVersion: req.httpVersion,
    httpVersionMajor: req.httpVersionMajor,
    httpVersionMinor: req.httpVersionMinor,
    headers,
    rawHeaders: Object.entries(headers).flatMap(([name, value]) => [value ?? ""].flat().flatMap((one) => [name, one])),
    complete: true,
  });
  copy.push(body);
  copy.push(null);
  return copy;
}
