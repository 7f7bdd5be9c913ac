// Walks tests/authz/matrix.ts: every route handler method is called for every role and anonymous,
// every server action is run the same way (with Next's request scope stubbed), and every page's
// source is checked for its guard. An entry point of app/ missing from the table fails the test.
import { randomBytes } from "node:crypto";
import { readdirSync, readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { PNG } from "pngjs";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { can, type Permission } from "@/domain/permissions";
import { ROLES, type Role } from "@/domain/roles";
import { ACTIONS, actionKey, ATTACHMENT, BOTTLED, DEMO_EMAIL, DEVIATIONS, HTTP_METHODS, PAGES, ROUTES, routeKey, WHO, type Outcome, type PageGuard, type Who } from "../authz/matrix";
import { submit, type Action } from "../support/action-scope";
import { ORIGIN, jsonRequest, signInAs, tableDigests } from "../support/api";

// Server actions read the session through next/headers and their messages through next-intl:
// tests/support/action-scope.ts stands in for Next's request scope.
vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const ROOT = path.resolve(import.meta.dirname, "../..");
type Handler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;

/** Every page.tsx, route.ts and actions.ts under app/, as repository paths. */
function discover(name: string): string[] {
  return (readdirSync(path.join(ROOT, "app"), { recursive: true, encoding: "utf8" }) as string[])
    .map((f) => `app/${f.split(path.sep).join("/")}`)
    .filter((f) => path.posix.basename(f) === name)
    .sort();
}
const load = (file: string) => import(/* @vite-ignore */ path.join(ROOT, file)) as Promise<Record<string, unknown>>;

const cookies = {} as Record<Role, string>;
let bottled = "";
let attachmentId = "";
const blobs: string[] = [];
const fill = (text: string) => text.replace(BOTTLED, bottled).replace(ATTACHMENT, attachmentId);

beforeAll(async () => {
  for (const role of ROLES) cookies[role] = await signInAs(DEMO_EMAIL[role]);
  const { getSqlite } = await import("@/server/platform/db");
  bottled = (getSqlite().prepare("select code from lots where kind = 'bottled' order by id limit 1").get() as { code: string }).code;
  // One attachment to fetch: an 8×8 PNG of random pixels written by pngjs, filed by the brewery on P26-0001.
  const png = new PNG({ width: 8, height: 8 });
  randomBytes(png.data.length).copy(png.data);
  const form = new FormData();
  form.append("file", new File([new Uint8Array(PNG.sync.write(png))], "probe.png", { type: "image/png" }));
  const { POST } = (await load("app/api/lots/[code]/attachments/route.ts")) as { POST: Handler };
  const res = await POST(new Request(`${ORIGIN}/api/lots/P26-0001/attachments`, { method: "POST", body: form, headers: { host: "localhost:3000", cookie: cookies.admin } }), { params: Promise.resolve({ code: "P26-0001" }) });
  const body = (await res.json()) as { id: number; sha256: string };
  expect(res.status).toBe(201);
  attachmentId = String(body.id);
  blobs.push(body.sha256);
});

afterAll(() => {
  // The blob folder sits beside the test database and outlives it.
  for (const sha of blobs) rmSync(path.join(path.dirname(process.env.GRAINLINE_DB!), "files", sha.slice(0, 2), sha), { force: true });
});

const STATUS: Record<string, [number, string]> = { "401": [401, "unauthenticated"], "403": [403, "forbidden"], "404": [404, "not_found"], "422": [422, "invalid"] };

/** What a cell should answer: the table's outcome, unless a reported bug makes it answer otherwise. */
function expected(key: string, who: Who, outcome: Outcome): { outcome: Outcome; bug?: string } {
  const deviation = DEVIATIONS.find((d) => d.key === key && d.who.includes(who));
  return deviation ? { outcome: deviation.actual, bug: deviation.issue } : { outcome };
}

describe("the table covers app/ exactly", () => {
  it("names every page and no page that is gone", () => {
    expect(PAGES.map((p) => p.file).sort()).toEqual(discover("page.tsx"));
  });

  it("names every method of every route handler and no method that is gone", async () => {
    const present: string[] = [];
    for (const file of discover("route.ts")) {
      const mod = await load(file);
      for (const method of HTTP_METHODS) if (typeof mod[method] === "function") present.push(`${file} ${method}`);
    }
    expect([...new Set(ROUTES.map((r) => `${r.file} ${r.method}`))].sort()).toEqual(present.sort());
    expect(new Set(ROUTES.map(routeKey)).size, "each probe is named once").toBe(ROUTES.length);
  });

  it("names every exported server action and none that is gone", async () => {
    const present: string[] = [];
    for (const file of discover("actions.ts")) {
      const mod = await load(file);
      for (const [name, value] of Object.entries(mod)) if (typeof value === "function") present.push(`${file} ${name}`);
    }
    expect(ACTIONS.map(actionKey).sort()).toEqual(present.sort());
  });

  it("lists deviations only for cells where the table expects something else", () => {
    for (const d of DEVIATIONS) {
      const probe = ROUTES.find((r) => routeKey(r) === d.key) ?? ACTIONS.find((a) => actionKey(a) === d.key);
      expect(probe, d.key).toBeDefined();
      for (const who of d.who) expect(probe!.expect[who], `${d.key} ${who}`).not.toBe(d.actual);
    }
  });
});

/** Calls a handler as Next.js does; reads JSON bodies only (labels, PDFs and CSVs are not). */
async function send(handler: Handler, request: Request, params: Record<string, string>) {
  const response = await handler(request, { params: Promise.resolve(params) });
  const json = /json/.test(response.headers.get("content-type") ?? "");
  const text = await response.text();
  return { status: response.status, body: json && text ? (JSON.parse(text) as { error?: { code: string; message: string } }) : null };
}

describe("route handlers, for every role and anonymous", () => {
  for (const probe of ROUTES) {
    it(`${routeKey(probe)} — ${probe.why}`, async () => {
      const handler = ((await load(probe.file)) as Record<string, Handler>)[probe.method]!;
      const params = Object.fromEntries(Object.entries(probe.params ?? {}).map(([k, v]) => [k, fill(v)]));
      const wrong: string[] = [];
      for (const who of WHO) {
        const cookie = who === "anonymous" ? undefined : probe.session === "throwaway" ? await signInAs(DEMO_EMAIL[who]) : cookies[who];
        const { outcome, bug } = expected(routeKey(probe), who, probe.expect[who]);
        const request = jsonRequest(fill(probe.url), { method: probe.method, body: probe.body, cookie });
        const before = await tableDigests();
        const res = await send(handler, request, params);
        const label = `${who}: expected ${outcome}${bug ? ` (known bug: ${bug})` : ""}, got ${res.status} ${JSON.stringify(res.body)}`;
        if (outcome === "ok") {
          if (res.status < 200 || res.status > 299) wrong.push(label);
        } else {
          const [status, code] = STATUS[outcome]!;
          if (res.status !== status || res.body?.error?.code !== code || typeof res.body.error.message !== "string") wrong.push(label);
        }
        if (probe.session === "throwaway" && cookie) {
          // Sign-out must end the session on the server, not just blank the cookie.
          const me = ((await load("app/api/me/route.ts")) as { GET: Handler }).GET;
          const after = await send(me, jsonRequest("/api/me", { cookie }), {});
          if (after.status !== 401) wrong.push(`${who}: session still valid after sign-out (${after.status})`);
        } else if (JSON.stringify(await tableDigests()) !== JSON.stringify(before)) {
          wrong.push(`${who}: the probe changed the database`);
        }
      }
      expect(wrong).toEqual([]);
    });
  }
});

/** What a server action's answer means, in the table's words. */
async function runAction(cookie: string, action: Action, form: Record<string, string>): Promise<string> {
  const { translator } = await import("@/i18n/messages");
  const t = translator("en");
  const answer = await submit(cookie, action, form);
  if ("redirect" in answer) return `redirect:${answer.redirect}`;
  const { state } = answer;
  if (state.ok) return "ok";
  for (const [outcome, [, code]] of Object.entries(STATUS)) if (state.message === t(`errors.${code}` as never)) return outcome;
  return `form state ${JSON.stringify(state)}`;
}

describe("server actions, for every role and anonymous", () => {
  for (const entry of ACTIONS) {
    it(`${actionKey(entry)} — ${entry.guard.by === "public" ? `public: ${entry.guard.why}` : entry.guard.by === "permission" ? entry.guard.permission : `checked in ${entry.guard.checkedIn}`}`, async () => {
      const action = ((await load(entry.file)) as Record<string, Action>)[entry.name]!;
      const wrong: string[] = [];
      for (const who of WHO) {
        const cookie = who === "anonymous" ? "" : entry.session === "throwaway" ? await signInAs(DEMO_EMAIL[who]) : cookies[who];
        const { outcome, bug } = expected(actionKey(entry), who, entry.expect[who]);
        const before = await tableDigests();
        const got = await runAction(cookie, action, entry.form);
        if (got !== outcome) wrong.push(`${who}: expected ${outcome}${bug ? ` (known bug: ${bug})` : ""}, got ${got}`);
        if (entry.session === "throwaway" && cookie) {
          const me = ((await load("app/api/me/route.ts")) as { GET: Handler }).GET;
          if ((await send(me, jsonRequest("/api/me", { cookie }), {})).status !== 401) wrong.push(`${who}: session still valid after sign-out`);
        } else if (JSON.stringify(await tableDigests()) !== JSON.stringify(before)) {
          wrong.push(`${who}: the action changed the database`);
        }
      }
      expect(wrong).toEqual([]);
    });
  }

  it("each guarded action checks the session (and permission) in its own body, before parsing its form", () => {
    for (const entry of ACTIONS) {
      const source = readFileSync(path.join(ROOT, entry.file), "utf8");
      const start = source.indexOf(`export async function ${entry.name}(`);
      expect(start, actionKey(entry)).toBeGreaterThanOrEqual(0);
      const next = source.indexOf("\nexport ", start + 1);
      const body = source.slice(start, next < 0 ? undefined : next);
      const parse = body.search(/\.parse\(/);
      if (entry.guard.by === "permission") {
        const at = body.indexOf(`requirePermission("${entry.guard.permission}")`);
        expect(at, `${actionKey(entry)} calls requirePermission("${entry.guard.permission}")`).toBeGreaterThan(0);
        if (parse >= 0) expect(at, `${actionKey(entry)} checks before parsing`).toBeLessThan(parse);
        for (const role of ROLES) expect(entry.expect[role] === "403", `${actionKey(entry)} ${role}`).toBe(!can({ role }, entry.guard.permission));
      } else if (entry.guard.by === "user") {
        const at = body.indexOf("requireUser()");
        expect(at, `${actionKey(entry)} calls requireUser()`).toBeGreaterThan(0);
        if (parse >= 0) expect(at, `${actionKey(entry)} checks the session before parsing`).toBeLessThan(parse);
        expect(body, `${actionKey(entry)} hands the user to ${entry.guard.checkedIn}`).toContain(`${entry.guard.checkedIn}(`);
      } else {
        expect(body).not.toMatch(/require(User|Permission)\(/);
      }
      if (entry.guard.by !== "public") expect(entry.expect.anonymous, actionKey(entry)).toBe("401");
    }
  });
});

// Helpers some pages gate with, checked against the permissions the table says they stand for.
async function helperAllows(call: string, role: Role): Promise<boolean | undefined> {
  const user = { id: `probe-${role}`, role, partyId: "probe", email: "", name: "" };
  if (call === "importKindsFor(user)") return (await import("@/server/records/csv-import")).importKindsFor(user).length > 0;
  if (call === "canReadRecall(user)") return (await import("@/server/trace/recall")).canReadRecall(user);
  return undefined;
}

/** The outcome a guard implies for a role, from the role → permission map (src/domain/permissions.ts). */
function implied(guard: Exclude<PageGuard, { by: "public" }>, role: Role): Outcome {
  const holds = (p: Permission) => can({ role }, p);
  if (guard.by === "permission") return holds(guard.permission) ? "ok" : "403";
  if (guard.anyOf && !guard.anyOf.some(holds)) return "403";
  return guard.ownLotsOnly && !holds("records:read-all") ? "404-if-not-own" : "ok";
}

describe("pages (rendering needs Next.js; their source must call the guard the table names)", () => {
  for (const page of PAGES) {
    it(`${page.file} — ${page.guard.by === "permission" ? page.guard.permission : page.guard.by}`, async () => {
      const source = readFileSync(path.join(ROOT, page.file), "utf8");
      const named = [...source.matchAll(/requirePagePermission\(\s*"([^"]+)"\s*\)/g)].map((m) => m[1]);
      const guard = page.guard;
      for (const text of "source" in guard ? (guard.source ?? []) : []) expect(source, `${page.file} contains ${text}`).toContain(text);
      if (guard.by === "public") {
        expect(source, `${page.file} is public and calls no page guard`).not.toMatch(/requirePage(User|Permission)\(/);
        return;
      }
      expect(page.expect.anonymous).toBe("redirect:/sign-in");
      if (guard.by === "permission") {
        expect(named, `${page.file} checks ${guard.permission}`).toEqual([guard.permission]);
        expect(source).not.toContain("requirePageUser(");
      } else {
        expect(named).toEqual([]);
        expect(source).toContain("requirePageUser()");
        if (guard.anyOf) {
          expect(source, `${page.file} answers 403 itself`).toContain("forbidden()");
          const helpers = (guard.source ?? []).filter((s) => /^\w+\(user\)$/.test(s));
          if (!helpers.length) for (const p of guard.anyOf) expect(source, `${page.file} checks ${p}`).toContain(`can(user, "${p}")`);
          for (const call of helpers) for (const role of ROLES) expect(await helperAllows(call, role), `${call} for ${role}`).toBe(guard.anyOf.some((p) => can({ role }, p)));
        }
        if (guard.ownLotsOnly) {
          expect(source).toMatch(/findLot(Id)?\(user, /);
          expect(source).toContain("notFound()");
        }
      }
      for (const role of ROLES) expect(page.expect[role], `${page.file} ${role}`).toBe(implied(guard, role));
    });
  }
});
