import { describe, expect, it } from "vitest";
import { POST as signInRoute } from "../../app/api/auth/sign-in/route";
import { POST as signOutRoute } from "../../app/api/auth/sign-out/route";
import { GET as meRoute } from "../../app/api/me/route";
import { GET as listUsersRoute, POST as inviteRoute } from "../../app/api/users/route";
import { PEER_HEADER } from "@/server/platform/client-address";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

describe("GET /api/me", () => {
  it("answers 401 without a session", async () => {
    const res = await call(meRoute, jsonRequest("/api/me"));
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe("unauthenticated");
  });

  it("returns the signed-in user", async () => {
    const cookie = await signInAs("grower@example.com");
    const res = await call(meRoute, jsonRequest("/api/me", { cookie }));
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ id: "user-grower", email: "grower@example.com", name: "Ikeda Haruto", role: "grower", partyId: "grower-ikeda" });
  });
});

describe("POST /api/auth/sign-in", () => {
  it("sets an httpOnly, SameSite=Lax session cookie, Secure only over https", async () => {
    const plain = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: "sales@example.com", password: "grainline-demo" } }));
    const cookie = plain.headers.get("set-cookie")!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i);
    const tls = await call(
      signInRoute,
      jsonRequest("/api/auth/sign-in", { body: { email: "sales@example.com", password: "grainline-demo" }, headers: { "x-forwarded-proto": "https" } }),
    );
    expect(tls.headers.get("set-cookie")).toMatch(/Secure/);
  });

  it("opens a new session on every sign-in", async () => {
    const first = await signInAs("auditor@example.com");
    const second = await signInAs("auditor@example.com");
    expect(first).not.toBe(second);
  });

  it("answers 401 for a wrong password or an unknown e-mail", async () => {
    const wrong = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: "miller@example.com", password: "not-it" } }));
    expect(wrong.status).toBe(401);
    const unknown = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: "nobody@example.com", password: "x" } }));
    expect(unknown.status).toBe(401);
    expect(unknown.body.error.message).toBe(wrong.body.error.message);
  });

  it("answers 422 with field errors for a malformed body, changing nothing", async () => {
    const before = await tableDigests();
    const badJson = await call(signInRoute, jsonRequest("/api/auth/sign-in", { rawBody: "{email:" }));
    expect(badJson.status).toBe(422);
    const wrongTypes = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: 42, password: ["x"] } }));
    expect(wrongTypes.status).toBe(422);
    expect(Object.keys(wrongTypes.body.error.fields).sort()).toEqual(["email", "password"]);
    const overlong = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: `${"a".repeat(300)}@example.com`, password: "x" } }));
    expect(overlong.status).toBe(422);
    expect(overlong.body.error.fields.email).toBeDefined();
    expect(await tableDigests()).toEqual(before);
  });

  it("throttles repeated failures for one e-mail from one client with 429 (tests/integration/sign-in-throttle.test.ts: other clients)", async () => {
    const attempt = () => call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: "brewer@example.com", password: "guess" } }));
    for (let i = 0; i < 5; i++) expect((await attempt()).status).toBe(401);
    const blocked = await attempt();
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.message).toMatch(/Wait \d+ seconds?/);
    // Even the right password waits out the delay: the throttle comes first.
    const right = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: "brewer@example.com", password: "grainline-demo" } }));
    expect(right.status).toBe(429);
  });

  it("throttles one client trying many e-mails", async () => {
    const headers = { [PEER_HEADER]: "203.0.113.9" };
    const statuses: number[] = [];
    for (let i = 0; i < 31; i++) {
      const res = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: `spray${i}@example.com`, password: "x" }, headers }));
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 30).every((s) => s === 401)).toBe(true);
    expect(statuses[30]).toBe(429);
  });

  it("a client cannot escape its limit by inventing X-Forwarded-For addresses (no proxy trusted)", async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 31; i++) {
      const headers = { [PEER_HEADER]: "203.0.113.77", "x-forwarded-for": `198.51.100.${i + 1}` };
      const res = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: `rotate${i}@example.com`, password: "x" }, headers }));
      statuses.push(res.status);
    }
    expect(statuses[30]).toBe(429);
  });

  it("refuses a browser post from another origin", async () => {
    const res = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: "admin@example.com", password: "grainline-demo" }, headers: { origin: "https://evil.example" } }));
    expect(res.status).toBe(403);
    expect(res.headers.get("set-cookie")).toBeNull();
  });
});

describe("POST /api/auth/sign-out", () => {
  it("ends the session on the server: the old cookie no longer works", async () => {
    const cookie = await signInAs("sales@example.com");
    expect((await call(meRoute, jsonRequest("/api/me", { cookie }))).status).toBe(200);
    const out = await call(signOutRoute, jsonRequest("/api/auth/sign-out", { method: "POST", cookie }));
    expect(out.status).toBe(204);
    expect((await call(meRoute, jsonRequest("/api/me", { cookie }))).status).toBe(401);
  });
});

describe("users API", () => {
  it("is forbidden to a grower", async () => {
    const cookie = await signInAs("grower2@example.com");
    expect((await call(listUsersRoute, jsonRequest("/api/users", { cookie }))).status).toBe(403);
    const before = await tableDigests();
    const invite = await call(inviteRoute, jsonRequest("/api/users", { cookie, body: { name: "X", email: "x@example.com", role: "admin", partyId: "brewery-kirinoha" } }));
    expect(invite.status).toBe(403);
    expect(await tableDigests()).toEqual(before);
  });

  it("lists users for the admin without password hashes", async () => {
    const cookie = await signInAs("admin@example.com");
    const res = await call(listUsersRoute, jsonRequest("/api/users", { cookie }));
    expect(res.status).toBe(200);
    expect(res.body.items).toHaveLength(7);
    expect(JSON.stringify(res.body)).not.toMatch(/argon2/);
  });
});
