// Property-based bad lot codes (fast-check) against every route that reads a lot by the code in
// its address: hostile and overlong text, injection strings, codes of the right shape that do
// not exist. Never a 5xx; when not 2xx, the error shape of ../shared/api.md; nothing written.
// And a lot the reader may not see answers exactly as a code that does not exist (DEVELOPERS.md,
// "the visibility rule"), on every one of these routes.
import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { STATUS_FOR_CODE, type ErrorCode } from "@/server/platform/errors";
import { getSqlite } from "@/server/platform/db";
import { GET as claims } from "../../app/api/claims/[code]/route";
import { GET as lotAttachments } from "../../app/api/lots/[code]/attachments/route";
import { GET as lotEvents } from "../../app/api/lots/[code]/events/route";
import { GET as label } from "../../app/api/lots/[code]/label.png/route";
import { GET as lineage } from "../../app/api/lots/[code]/lineage/route";
import { GET as lot } from "../../app/api/lots/[code]/route";
import { GET as sheet } from "../../app/api/provenance/[code]/sheet.pdf/route";
import { GET as epcis } from "../../app/api/trace/[code]/epcis/route";
import { GET as recallCsv } from "../../app/api/trace/[code]/recall.csv/route";
import { GET as trace } from "../../app/api/trace/[code]/route";
import { jsonRequest, signInAs, tableDigests } from "../support/api";
import { hostileText } from "../support/bad-input";

/** Fixed, so that a failure reproduces (FUZZ_SEED / FUZZ_RUNS for a longer hunt, as in bad-input.property.test.ts). */
const SEED = Number(process.env.FUZZ_SEED ?? 20_261_203);
const RUNS = Number(process.env.FUZZ_RUNS ?? 30);

type Handler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;
const ROUTES: [path: (code: string) => string, Handler][] = [
  [(c) => `/api/lots/${c}`, lot],
  [(c) => `/api/lots/${c}/events`, lotEvents],
  [(c) => `/api/lots/${c}/attachments`, lotAttachments],
  [(c) => `/api/lots/${c}/label.png`, label],
  [(c) => `/api/lots/${c}/lineage`, lineage],
  [(c) => `/api/claims/${c}`, claims],
  [(c) => `/api/trace/${c}`, trace],
  [(c) => `/api/trace/${c}/recall.csv`, recallCsv],
  [(c) => `/api/trace/${c}/epcis`, epcis],
  [(c) => `/api/provenance/${c}/sheet.pdf`, sheet],
];

const cookies: Record<string, string> = {};
beforeAll(async () => {
  for (const who of ["admin", "grower", "sales"]) cookies[who] = await signInAs(`${who}@example.com`);
});

/** The route as Next calls it: the code decoded from the address, and the address as the browser sent it. */
async function get(route: Handler, path: (code: string) => string, code: string, who: string) {
  const response = await route(jsonRequest(path(encodeURIComponent(code)), { cookie: cookies[who] }), { params: Promise.resolve({ code }) });
  return { status: response.status, type: response.headers.get("content-type") ?? "", text: await response.text() };
}

/** Lot codes of the shape lots are given (kind letters, year, number) and anything else. */
const codes = fc.oneof(
  hostileText,
  fc.string({ maxLength: 400 }),
  fc.tuple(fc.constantFrom("H", "P", "T", "BT", "BL", "ZZ"), fc.integer({ min: 0, max: 99 }), fc.integer({ min: 0, max: 99_999 })).map(([k, y, n]) => `${k}${String(y).padStart(2, "0")}-${String(n).padStart(4, "0")}`),
);

describe("every lot-code route, with codes no one should send", () => {
  for (const [path, route] of ROUTES) {
    it(`GET ${path("{code}")}: never a 5xx, the error shape when refused, nothing written`, async () => {
      const before = await tableDigests(["sessions"]);
      await fc.assert(
        fc.asyncProperty(codes, fc.constantFrom("admin", "grower", "sales"), async (code, who) => {
          const answer = await get(route, path, code, who);
          const where = `${path(code)} as ${who}: ${answer.status} ${answer.text.slice(0, 200)}`;
          expect(answer.status, `never a 5xx: ${where}`).toBeLessThan(500);
          if (answer.status >= 300) {
            const body = JSON.parse(answer.text) as { error?: { code?: ErrorCode; message?: unknown } };
            expect(body.error?.code && STATUS_FOR_CODE[body.error.code], `error shape: ${where}`).toBe(answer.status);
            expect(typeof body.error?.message, where).toBe("string");
          }
        }),
        { seed: SEED, numRuns: RUNS },
      );
      expect(await tableDigests(["sessions"])).toEqual(before);
    });
  }
});

describe("a lot the reader may not see, on every lot-code route", () => {
  it("answers a grower as a code that does not exist, byte for byte but for the code", async () => {
    // A tank of the brewery: no grower holds or made it.
    const unseen = (getSqlite().prepare("select code from lots where kind = 'tank' order by id limit 1").get() as { code: string }).code;
    const unknown = unseen.replace(/\d+$/, (n) => "9".repeat(n.length));
    expect(getSqlite().prepare("select 1 from lots where code = ?").get(unknown)).toBeUndefined();
    const seenByOffice = await get(lot, ROUTES[0]![0], unseen, "admin");
    expect(seenByOffice.status).toBe(200);
    for (const [path, route] of ROUTES) {
      const a = await get(route, path, unseen, "grower");
      const b = await get(route, path, unknown, "grower");
      expect(a.status, path("{code}")).toBeGreaterThanOrEqual(400);
      expect({ ...a, text: a.text.replaceAll(unseen, "") }, path("{code}")).toEqual({ ...b, text: b.text.replaceAll(unknown, "") });
    }
  });
});
