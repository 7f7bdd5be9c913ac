// Links Grainline writes into e-mails and labels carry the configured public origin, never one
// the request names. The attack is OWASP's "host header injection" (Web Security Testing Guide,
// WSTG-INPV-17): a forged Host or X-Forwarded-Host makes a password-reset e-mail carry its token
// to the attacker's server.
import http from "node:http";
import type { AddressInfo } from "node:net";
import { desc } from "drizzle-orm";
import jsQR from "jsqr";
import { PNG } from "pngjs";
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { outbox } from "@/db/schema";
import { getDb } from "@/server/platform/db";
import { frontDoor } from "@/server/platform/front-door";
import { publicOrigin, transportSecurityHeaders } from "@/server/platform/public-origin";
import { POST as inviteRoute } from "../../app/api/users/route";
import { GET as labelPng } from "../../app/api/lots/[code]/label.png/route";
import { POST as adjustmentRoute } from "../../app/api/suppliers/[partyId]/adjustments/route";
import { POST as statementRoute } from "../../app/api/suppliers/[partyId]/statements/route";
import { forgotPasswordAction } from "../../app/(auth)/forgot-password/actions";
import { inviteUserAction } from "../../app/(office)/admin/users/actions";
import { submit } from "../support/action-scope";
import { call, jsonRequest, signInAs } from "../support/api";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const FORGED = { host: "evil.example", "x-forwarded-host": "evil.example", "x-forwarded-proto": "https" };
const CONFIGURED = "https://sake.kirinoha.example";
let admin: string;

const latestMail = () => getDb().select().from(outbox).orderBy(desc(outbox.createdAt)).get()!;
const linksIn = (text: string) => text.match(/https?:\/\/[^\s]+/g) ?? [];

beforeAll(async () => {
  admin = await signInAs("admin@example.com");
});
afterEach(() => vi.unstubAllEnvs());

describe("the public origin", () => {
  it("is GRAINLINE_ORIGIN's scheme, host and port; else the address npm start prints", () => {
    expect(publicOrigin({ GRAINLINE_ORIGIN: "https://sake.kirinoha.example/" })).toBe("https://sake.kirinoha.example");
    expect(publicOrigin({ GRAINLINE_ORIGIN: "http://10.0.0.5:8080" })).toBe("http://10.0.0.5:8080");
    expect(publicOrigin({ PORT: "3100" })).toBe("http://localhost:3100");
    expect(publicOrigin({})).toBe("http://localhost:3000");
    expect(() => publicOrigin({ GRAINLINE_ORIGIN: "javascript:alert(1)" })).toThrow(/http or https/);
    expect(() => publicOrigin({ GRAINLINE_ORIGIN: "sake.example" })).toThrow(/not an address/);
  });

  // RFC 6797 §7.2: an HSTS host sends Strict-Transport-Security only over secure transport.
  it("asks for Strict-Transport-Security only when the public origin is https", () => {
    expect(transportSecurityHeaders({ GRAINLINE_ORIGIN: CONFIGURED })).toEqual([["Strict-Transport-Security", "max-age=31536000"]]);
    expect(transportSecurityHeaders({ GRAINLINE_ORIGIN: "http://brewery.example" })).toEqual([]);
    expect(transportSecurityHeaders({ PORT: "3000" })).toEqual([]);
  });

  it("the header src/cli/serve.ts sets before the front door survives the front door's own refusal", async () => {
    const door = frontDoor((_req, res) => res.writeHead(599).end());
    const server = http.createServer((req, res) => {
      for (const [name, value] of transportSecurityHeaders({ GRAINLINE_ORIGIN: CONFIGURED })) res.setHeader(name, value);
      door.request(req, res);
    });
    await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
    try {
      const { port } = server.address() as AddressInfo;
      // "%zz" is no percent-escape (RFC 3986 §2.1): the front door answers 400 itself, Next never sees it.
      const res = await fetch(`http://127.0.0.1:${port}/api/lots/%zz`, { headers: { cookie: admin } });
      expect(res.status).toBe(400);
      expect(res.headers.get("strict-transport-security")).toBe("max-age=31536000");
      expect(res.headers.get("x-frame-options")).toBe("DENY");
    } finally {
      await new Promise((resolve) => server.close(resolve));
    }
  });
});

// With GRAINLINE_ORIGIN unset the links once took the forged host; with it set they already held.
const SETTINGS = [
  { setting: "GRAINLINE_ORIGIN unset", env: "", origin: "http://localhost:3100" },
  { setting: "GRAINLINE_ORIGIN set", env: CONFIGURED, origin: CONFIGURED },
];

describe.each(SETTINGS)("links under a forged Host and X-Forwarded-Host, $setting", ({ env, origin }) => {
  const setLink = new RegExp(`^${origin.replace(/\./g, "\\.")}/set-password/[A-Za-z0-9_-]{40,}$`);
  beforeEach(() => {
    vi.stubEnv("GRAINLINE_ORIGIN", env);
    vi.stubEnv("PORT", "3100");
  });

  it("a reset e-mail asked for from the forgot-password form", async () => {
    const res = await submit("", forgotPasswordAction, { email: "sales@example.com" }, FORGED);
    expect(res).toEqual({ state: expect.objectContaining({ ok: true }) });
    const mail = latestMail();
    expect(mail.toAddress).toBe("sales@example.com");
    expect(linksIn(mail.textBody)).toEqual([expect.stringMatching(setLink)]);
  });

  it("an invitation, from the API and from the users form", async () => {
    const who = env ? "set" : "unset";
    const api = await call(inviteRoute, jsonRequest("/api/users", { cookie: admin, headers: FORGED, body: { name: "Mori Aoi", email: `aoi.${who}@example.com`, role: "brewer", partyId: "brewery-kirinoha" } }));
    expect(api.status).toBe(201);
    expect(linksIn(latestMail().textBody)).toEqual([expect.stringMatching(setLink)]);
    const form = await submit(admin, inviteUserAction, { name: "Mori Ren", email: `ren.${who}@example.com`, role: "brewer", partyId: "brewery-kirinoha" }, FORGED);
    expect(form).toEqual({ state: expect.objectContaining({ ok: true }) });
    expect(latestMail().toAddress).toBe(`ren.${who}@example.com`);
    expect(linksIn(latestMail().textBody)).toEqual([expect.stringMatching(setLink)]);
  });

  it("a statement e-mail's link to its PDF", async () => {
    const day = new Date().toISOString().slice(0, 10);
    // Something for the statement to state.
    const adjusted = await call(adjustmentRoute, jsonRequest("/api/suppliers/grower-nakase/adjustments", { cookie: admin, body: { date: day, amountYen: 1_000, taxRatePct: 8, reason: "Bag count corrected" } }), { partyId: "grower-nakase" });
    expect(adjusted.status).toBe(201);
    const res = await call(statementRoute, jsonRequest("/api/suppliers/grower-nakase/statements", { cookie: admin, headers: FORGED, body: { from: day, to: day, email: true } }), { partyId: "grower-nakase" });
    expect(res.status).toBe(201);
    expect(linksIn(latestMail().textBody)).toEqual([`${origin}/api/suppliers/grower-nakase/statements/${res.body.number}/statement.pdf`]);
  });

  it("a label's QR code (read back by jsQR)", async () => {
    const grower = await signInAs("grower@example.com");
    const lot = "H26-0001";
    const res = await labelPng(jsonRequest(`/api/lots/${lot}/label.png`, { cookie: grower, headers: FORGED }), { params: Promise.resolve({ code: lot }) });
    expect(res.status).toBe(200);
    const png = PNG.sync.read(Buffer.from(await res.arrayBuffer()));
    expect(jsQR(Uint8ClampedArray.from(png.data), png.width, png.height)?.data).toBe(`${origin}/l/${lot}`);
  });
});
