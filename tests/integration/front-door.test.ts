// The production server's request handler (src/server/platform/front-door.ts, run by src/cli/serve.ts)
// in front of a stand-in for Next that calls the real route handlers.
// Sources: RFC 9110 §15.5.14 (413 Content Too Large: the server may close the connection) and
// §15.5.1 (400 Bad Request); RFC 9112 §7.1 (chunked transfer coding); RFC 3986 §2.1 (a
// percent-escape is "%" followed by two hexadecimal digits); ECMA-262 decodeURIComponent
// (throws URIError on a malformed escape or a cut UTF-8 sequence). 1 MiB = 1,048,576 bytes is
// Next.js's documented default for server actions ("1mb", read by the `bytes` package; from memory).
import { IncomingMessage } from "node:http";
import { Socket } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { MAX_BODY_BYTES } from "@/server/platform/body-limits";
import { getSqlite } from "@/server/platform/db";
import { malformedPath } from "@/server/platform/front-door";
import { readCapped } from "@/server/platform/request-body";
import { SECURITY_HEADERS } from "@/server/platform/security-headers";
import { POST as eventsRoute } from "../../app/api/events/route";
import { POST as fieldsRoute } from "../../app/api/fields/route";
import { POST as uploadRoute } from "../../app/api/lots/[code]/attachments/route";
import { GET as lotRoute } from "../../app/api/lots/[code]/route";
import { signInAs, tableDigests } from "../support/api";
import { sendRaw, startFrontDoor, type RawAnswer } from "../support/next-stand-in";

const MiB = 1024 * 1024;
let server: Awaited<ReturnType<typeof startFrontDoor>>;
let brewer: string, grower: string;

beforeAll(async () => {
  server = await startFrontDoor([
    { method: "GET", pattern: /^\/api\/lots\/([^/]+)$/, handler: lotRoute, params: (m) => ({ code: decodeURIComponent(m[1]!) }) },
    { method: "POST", pattern: /^\/api\/events$/, handler: eventsRoute },
    { method: "POST", pattern: /^\/api\/fields$/, handler: fieldsRoute },
    { method: "POST", pattern: /^\/api\/lots\/([^/]+)\/attachments$/, handler: uploadRoute, params: (m) => ({ code: decodeURIComponent(m[1]!) }) },
  ]);
  brewer = await signInAs("brewer@example.com");
  grower = await signInAs("grower@example.com");
});
afterAll(() => server.close());

const json = (value: unknown) => Buffer.from(JSON.stringify(value));
/** A JSON body of exactly `size` bytes: a field whose name is padded out. */
const paddedField = (size: number) => {
  const shell = JSON.stringify({ name: "", region: "Hyogo", areaHa: 1 });
  return Buffer.from(JSON.stringify({ name: "x".repeat(size - shell.length), region: "Hyogo", areaHa: 1 }));
};
const chunksOf = (body: Buffer, size = 64 * 1024) => Array.from({ length: Math.ceil(body.length / size) }, (_, i) => body.subarray(i * size, (i + 1) * size));
const eventCount = () => (getSqlite().prepare("select count(*) as n from events").get() as { n: number }).n;

function expectSecurityHeaders(answer: RawAnswer) {
  for (const { key, value } of SECURITY_HEADERS) expect(answer.headers[key.toLowerCase()], key).toBe(value);
}

/** Answered 413 with the headers and the API's error shape, without reaching Next, nothing written. */
async function expectRefusedUnread(send: () => Promise<RawAnswer>, message = "The request is larger than 1 MB; nothing was read or changed.") {
  const before = await tableDigests();
  const reached = server.reached.length;
  const answer = await send();
  expect(answer.status).toBe(413);
  expectSecurityHeaders(answer);
  expect(answer.headers.connection).toBe("close");
  expect(JSON.parse(answer.body)).toEqual({ error: { code: "too_large", message } });
  expect(server.reached.length).toBe(reached);
  expect(await tableDigests()).toEqual(before);
}

describe("bodies over 1 MiB are refused before they are read", () => {
  const twoMB = paddedField(2 * MiB);

  it("a 2 MB POST to /api/events (the floor's busiest write): 413", async () => {
    await expectRefusedUnread(() => sendRaw(server.port, { path: "/api/events", headers: { cookie: brewer, "content-type": "application/json" }, body: twoMB }));
  });

  it("a 2 MB POST to a route Next serves (/api/fields): 413", async () => {
    await expectRefusedUnread(() => sendRaw(server.port, { path: "/api/fields", headers: { cookie: grower, "content-type": "application/json" }, body: twoMB }));
  });

  it("a declared 2 MB body is answered with no byte of it sent", async () => {
    await expectRefusedUnread(() => sendRaw(server.port, { path: "/api/fields", headers: { cookie: grower }, declared: 2 * MiB }));
  });

  it("a client that waits for \"100 Continue\" before a 2 MB body is told 413 instead (RFC 9110 §10.1.1)", async () => {
    const answer = await sendRaw(server.port, { path: "/api/fields", headers: { cookie: grower, "content-type": "application/json" }, body: twoMB, expectContinue: true });
    expect(answer.status).toBe(413);
    expect(answer.continued).toBe(false);
    expectSecurityHeaders(answer);
    const small = await sendRaw(server.port, { path: "/api/fields", headers: { cookie: grower, "content-type": "application/json" }, body: paddedField(300), expectContinue: true });
    expect(small.continued).toBe(true);
    expect(small.status).toBe(422);
  });

  it("a 2 MB server-action post to a page: 413 in plain text", async () => {
    const answer = await sendRaw(server.port, { path: "/admin/parties", headers: { cookie: brewer, "next-action": "0".repeat(40), "content-type": "text/plain" }, body: Buffer.alloc(2 * MiB, 0x61) });
    expect(answer.status).toBe(413);
    expectSecurityHeaders(answer);
    expect(answer.headers["content-type"]).toBe("text/plain; charset=utf-8");
    expect(answer.body).toBe("The request is larger than 1 MB; nothing was read or changed.\n");
  });

  it("a chunked 2 MB body is counted while read and refused at the first byte past 1 MiB", async () => {
    await expectRefusedUnread(() => sendRaw(server.port, { path: "/api/events", headers: { cookie: brewer, "content-type": "application/json" }, chunks: chunksOf(twoMB) }));
  });

  it("reading stops at the chunk that passes the limit; what follows stays unread", async () => {
    const req = new IncomingMessage(new Socket());
    const reading = readCapped(req, MAX_BODY_BYTES);
    req.push(Buffer.alloc(MAX_BODY_BYTES));
    req.push(Buffer.alloc(1));
    await expect(reading).resolves.toBeNull();
    req.push(Buffer.alloc(MiB));
    expect(req.isPaused()).toBe(true);
    expect(req.readableLength).toBe(MiB);
  });

  it("exactly 1 MiB is let through to the route, which answers it", async () => {
    expect(MAX_BODY_BYTES).toBe(1_048_576);
    const answer = await sendRaw(server.port, { path: "/api/fields", headers: { cookie: grower, "content-type": "application/json" }, body: paddedField(MAX_BODY_BYTES) });
    expect(server.reached.at(-1)).toEqual({ method: "POST", url: "/api/fields" });
    expect(answer.status).toBe(422);
    expect(JSON.parse(answer.body).error.fields.name).toEqual([expect.stringMatching(/^Use at most \d+ characters\.$/)]);
  });
});

describe("streamed (chunked) bodies within the limit are read, then served as any other", () => {
  const measuring = { step: "measuring", inputs: [{ lot: "P26-0001", quantity: 0 }], measurements: [{ name: "moisturePct", value: 13.4, unit: "%" }] };

  it("a small chunked event is recorded", async () => {
    const before = eventCount();
    const answer = await sendRaw(server.port, { path: "/api/events", headers: { cookie: brewer, "content-type": "application/json" }, chunks: chunksOf(json(measuring), 16) });
    expect(answer.status).toBe(201);
    expect(eventCount()).toBe(before + 1);
  });

  it("a 200 KB chunked body reaches Next whole, with its length", async () => {
    const answer = await sendRaw(server.port, { path: "/api/fields", headers: { cookie: grower, "content-type": "application/json" }, chunks: chunksOf(paddedField(200 * 1024)) });
    expect(server.reached.at(-1)).toEqual({ method: "POST", url: "/api/fields" });
    expect(answer.status).toBe(422);
    expect(JSON.parse(answer.body).error.fields.name).toEqual([expect.stringMatching(/^Use at most \d+ characters\.$/)]);
  });
});

describe("attachments keep their own 10 MB limit", () => {
  const upload = (file: Buffer, extra: { chunked?: boolean } = {}) => {
    const boundary = "grainline-test-boundary";
    const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="scan.pdf"\r\nContent-Type: application/pdf\r\n\r\n`);
    const body = Buffer.concat([head, file, Buffer.from(`\r\n--${boundary}--\r\n`)]);
    const headers = { cookie: brewer, "content-type": `multipart/form-data; boundary=${boundary}` };
    return sendRaw(server.port, { path: "/api/lots/P26-0001/attachments", headers, ...(extra.chunked ? { chunks: chunksOf(body) } : { body }) });
  };
  const pdf = (size: number) => Buffer.concat([Buffer.from(`%PDF-1.4\n%${Date.now()}\n`), Buffer.alloc(size, 0x20)]);

  it("a 3 MB PDF is stored", async () => {
    const answer = await upload(pdf(3 * MiB));
    expect(answer.status).toBe(201);
  });

  it("a declared 12 MB upload is refused unread, in the route's words", async () => {
    await expectRefusedUnread(() => sendRaw(server.port, { path: "/api/lots/P26-0001/attachments", headers: { cookie: brewer }, declared: 12 * MiB }), "The file is larger than 10 MB.");
  });

  it("a chunked 12 MB upload is counted by the route itself: 413", async () => {
    const answer = await upload(pdf(12 * MiB), { chunked: true });
    expect(answer.status).toBe(413);
    expect(JSON.parse(answer.body).error.code).toBe("too_large");
  });
});

describe("malformed percent-escapes in the path", () => {
  const bad: [string, string][] = [
    ["/lots/%E0%A4%A", "a cut UTF-8 sequence"],
    ["/api/lots/%zz", "not hexadecimal"],
    ["/01/%/10/x", "a bare %"],
    ["/api/lots/%C0%AF", "an overlong UTF-8 form"],
  ];
  it.each(bad)("%s (%s): 400 with the security headers, never reaching Next", async (path) => {
    const reached = server.reached.length;
    const answer = await sendRaw(server.port, { method: "GET", path });
    expect(answer.status).toBe(400);
    expectSecurityHeaders(answer);
    const message = "This address has a broken percent-escape (a % must be followed by two hexadecimal digits).";
    if (path.startsWith("/api/")) expect(JSON.parse(answer.body)).toEqual({ error: { code: "bad_request", message } });
    else expect(answer.body).toBe(`${message}\n`);
    expect(server.reached.length).toBe(reached);
  });

  it("well-formed escapes are served as before", async () => {
    const lot = await sendRaw(server.port, { method: "GET", path: "/api/lots/P26%2D0001", headers: { cookie: brewer } });
    expect(lot.status).toBe(200);
    expect(JSON.parse(lot.body).code).toBe("P26-0001");
    const page = await sendRaw(server.port, { method: "GET", path: "/01/09506000134352/10/A%20B%E3%81%82" });
    expect(page.status).toBe(200);
    expect(server.reached.at(-1)?.url).toBe("/01/09506000134352/10/A%20B%E3%81%82");
  });

  it("the guard's own verdicts", () => {
    for (const [path] of bad) expect(malformedPath(path), path).toBe(true);
    for (const path of ["/", "/api/lots/P26%2D0001", "/01/09506000134352/10/%E3%81%82", "/a%25b"]) expect(malformedPath(path), path).toBe(false);
  });
});
