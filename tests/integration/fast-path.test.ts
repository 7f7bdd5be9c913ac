// The production server answers GET /api/lots/{code} and POST /api/events ahead of Next's
// router (src/server/platform/fast-path.ts). These tests hold it to the route handlers Next calls: the
// same status and body for the same request, the same headers, and everything it should not
// take left to Next.
import http from "node:http";
import net from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getSqlite } from "@/server/platform/db";
import { FAST_PATH_MAX_BODY, readBody } from "@/server/platform/fast-path";
import { SECURITY_HEADERS } from "@/server/platform/security-headers";
import { POST as eventsRoute } from "../../app/api/events/route";
import { GET as lotRoute } from "../../app/api/lots/[code]/route";
import { call, jsonRequest, ORIGIN, signInAs } from "../support/api";
import { LEFT_TO_NEXT, startFastPathServer } from "../support/fast-path-server";

let fast: Awaited<ReturnType<typeof startFastPathServer>>;
const cookies: Record<string, string> = {};

beforeAll(async () => {
  fast = await startFastPathServer();
  for (const who of ["brewer", "grower", "auditor", "miller"]) cookies[who] = await signInAs(`${who}@example.com`);
});
afterAll(() => fast.close());

async function viaFast(request: Request, extra?: Record<string, string>) {
  const response = await fast.send(request, extra);
  const text = await response.text();
  return { status: response.status, headers: response.headers, body: text ? JSON.parse(text) : null };
}

const growersOwnLot = () => (getSqlite().prepare("select code from lots where origin_party_id = 'grower-ikeda' order by id limit 1").get() as { code: string }).code;

describe("GET /api/lots/{code} on the fast path", () => {
  const cases: [string, () => string, string | undefined, string][] = [
    ["a brewer reads a lot", () => "/api/lots/P26-0001", "brewer", "P26-0001"],
    ["a lower-case code", () => "/api/lots/p26-0001", "brewer", "p26-0001"],
    ["a percent-encoded code", () => "/api/lots/P26%2D0001", "brewer", "P26-0001"],
    ["a query string", () => "/api/lots/P26-0001?view=floor", "brewer", "P26-0001"],
    ["the auditor reads it", () => "/api/lots/P26-0001", "auditor", "P26-0001"],
    ["a grower reads their own harvest", () => `/api/lots/${growersOwnLot()}`, "grower", ""],
    ["a grower asks for the brewery's lot", () => "/api/lots/P26-0001", "grower", "P26-0001"],
    ["no such lot", () => "/api/lots/ZZ99-9999", "brewer", "ZZ99-9999"],
    ["no session", () => "/api/lots/P26-0001", undefined, "P26-0001"],
  ];
  it.each(cases)("%s: the same answer as the route handler", async (_name, path, who, param) => {
    const url = path();
    const code = param || decodeURIComponent(url.split("/").pop()!);
    const make = () => jsonRequest(url, { cookie: who ? cookies[who] : undefined });
    const expected = await call(lotRoute, make(), { code });
    const actual = await viaFast(make());
    expect(actual.status).toBe(expected.status);
    expect(actual.body).toEqual(expected.body);
  });

  it("the statuses are the ones the contract names", async () => {
    expect((await viaFast(jsonRequest("/api/lots/P26-0001", { cookie: cookies.brewer }))).status).toBe(200);
    expect((await viaFast(jsonRequest("/api/lots/P26-0001", { cookie: cookies.grower }))).status).toBe(404);
    expect((await viaFast(jsonRequest("/api/lots/P26-0001"))).status).toBe(401);
  });

  it("every answer carries the site's security headers and a JSON type", async () => {
    for (const cookie of [cookies.brewer, undefined]) {
      const { headers } = await viaFast(jsonRequest("/api/lots/P26-0001", { cookie }));
      for (const { key, value } of SECURITY_HEADERS) expect(headers.get(key), key).toBe(value);
      expect(headers.get("content-type")).toBe("application/json");
    }
  });
});

describe("POST /api/events on the fast path", () => {
  const measuring = { step: "measuring", inputs: [{ lot: "P26-0001", quantity: 0 }], measurements: [{ name: "moisturePct", value: 13.2, unit: "%" }] };
  const eventCount = () => (getSqlite().prepare("select count(*) as n from events").get() as { n: number }).n;

  it("records an event exactly as the route handler does", async () => {
    const before = eventCount();
    const expected = await call(eventsRoute, jsonRequest("/api/events", { cookie: cookies.brewer, body: measuring }));
    const actual = await viaFast(jsonRequest("/api/events", { cookie: cookies.brewer, body: measuring }));
    expect(expected.status).toBe(201);
    expect(actual.status).toBe(201);
    expect(actual.body.id).toBe(expected.body.id + 1);
    expect({ ...actual.body, id: 0 }).toEqual({ ...expected.body, id: 0 });
    expect(eventCount()).toBe(before + 2);
    const measured = getSqlite().prepare("select value from measurements where event_id = ?").get(actual.body.id) as { value: number };
    expect(measured.value).toBe(13.2);
  });

  it("shares the Idempotency-Key store with the route handler: a retry on either path answers the first response", async () => {
    const key = `fast-path-${Date.now()}`;
    const headers = { "idempotency-key": key };
    const first = await call(eventsRoute, jsonRequest("/api/events", { cookie: cookies.brewer, body: measuring, headers }));
    const before = eventCount();
    const retry = await viaFast(jsonRequest("/api/events", { cookie: cookies.brewer, body: measuring, headers }));
    expect(retry.status).toBe(first.status);
    expect(retry.body).toEqual(first.body);
    expect(eventCount()).toBe(before);
  });

  const refusals: [string, () => Request, number][] = [
    ["malformed JSON", () => jsonRequest("/api/events", { cookie: cookies.brewer, rawBody: "{not json" }), 422],
    ["an empty body", () => jsonRequest("/api/events", { cookie: cookies.brewer, rawBody: "" }), 422],
    ["a wrong shape", () => jsonRequest("/api/events", { cookie: cookies.brewer, body: { ...measuring, inputs: "P26-0001" } }), 422],
    ["no session", () => jsonRequest("/api/events", { body: measuring }), 401],
    ["another site's page posting", () => jsonRequest("/api/events", { cookie: cookies.brewer, body: measuring, headers: { origin: "https://elsewhere.example" } }), 403],
    ["a grower measuring a lot they cannot see (unknown, as if missing)", () => jsonRequest("/api/events", { cookie: cookies.grower, body: measuring }), 422],
    ["a grower soaking (their role records no brewing)", () => jsonRequest("/api/events", { cookie: cookies.grower, body: { step: "soaking", inputs: [{ lot: "P26-0001", quantity: 10 }], outputs: [{ kind: "soaked", quantity: 13, use: "koji" }], measurements: [] } }), 403],
    ["the auditor writing", () => jsonRequest("/api/events", { cookie: cookies.auditor, body: measuring }), 403],
    ["more than the lot holds", () => jsonRequest("/api/events", { cookie: cookies.brewer, body: { step: "soaking", inputs: [{ lot: "P26-0001", quantity: 1e6 }], outputs: [{ kind: "soaked", quantity: 1.3e6, use: "koji" }], measurements: [{ name: "soakMinutes", value: 30, unit: "min" }, { name: "waterTempC", value: 12, unit: "C" }] } }), 409],
  ];
  it.each(refusals)("%s: refused with the route handler's status and body, nothing written", async (_name, make, status) => {
    const before = eventCount();
    const expected = await call(eventsRoute, make());
    const actual = await viaFast(make());
    expect(expected.status).toBe(status);
    expect(actual.status).toBe(status);
    expect(actual.body).toEqual(expected.body);
    expect(eventCount()).toBe(before);
  });

  it("a body with a byte-order mark reads as the route handler reads it", async () => {
    const raw = `\uFEFF${JSON.stringify(measuring)}`;
    const expected = await call(eventsRoute, jsonRequest("/api/events", { cookie: cookies.brewer, rawBody: raw }));
    const actual = await viaFast(jsonRequest("/api/events", { cookie: cookies.brewer, rawBody: raw }));
    expect(actual.status).toBe(expected.status);
  });
});

describe("what the fast path leaves to Next", () => {
  const left: [string, () => Request, Record<string, string>?][] = [
    ["another route under /api/lots", () => jsonRequest("/api/lots/P26-0001/attachments", { cookie: cookies.brewer })],
    ["the lot list", () => jsonRequest("/api/lots", { cookie: cookies.brewer })],
    ["a malformed escape in the code", () => jsonRequest("/api/lots/%E0%A4%A", { cookie: cookies.brewer })],
    ["HEAD", () => new Request(`${ORIGIN}/api/lots/P26-0001`, { method: "HEAD", headers: { host: "localhost:3000", cookie: cookies.brewer! } })],
    ["a method the route does not have", () => new Request(`${ORIGIN}/api/events`, { method: "PUT", headers: { host: "localhost:3000" }, body: "{}" })],
    ["a page", () => new Request(`${ORIGIN}/floor`, { headers: { host: "localhost:3000" } })],
    ["a streamed body", () => jsonRequest("/api/events", { cookie: cookies.brewer, body: {} }), { "transfer-encoding": "chunked" }],
    ["a body over the size limit", () => jsonRequest("/api/events", { cookie: cookies.brewer, body: { step: "measuring", note: "x".repeat(FAST_PATH_MAX_BODY) } })],
  ];
  it.each(left)("%s", async (_name, make, extra) => {
    const response = await fast.send(make(), extra);
    expect(response.status).toBe(LEFT_TO_NEXT);
  });
});

describe("a request that waits its turn", () => {
  it("is dropped, not left waiting, when its client goes away first", async () => {
    const req = new http.IncomingMessage(new net.Socket());
    req.destroy();
    await expect(readBody(req)).rejects.toThrow(/closed before its body was read/);
    const open = new http.IncomingMessage(new net.Socket());
    const reading = readBody(open);
    open.destroy();
    await expect(reading).rejects.toThrow(/closed before its body was read/);
  });

  it("many requests at once are all answered, each as the route handler answers it", async () => {
    const codes = Array.from({ length: 24 }, (_, i) => (i % 3 === 0 ? "P26-0001" : `NOPE-${i}`));
    const answers = await Promise.all(codes.map((code) => fast.send(jsonRequest(`/api/lots/${code}`, { cookie: cookies.brewer }))));
    expect(answers.map((r) => r.status)).toEqual(codes.map((code) => (code === "P26-0001" ? 200 : 404)));
  });
});
