// Sign-in throttling must not become a way to lock someone out (OWASP Authentication Cheat
// Sheet, "Account lockout": an attacker can deny a user access by failing on purpose). Failures
// count per account AND client, with a wait that doubles; another client signs in at once.
// Client addresses are from the documentation ranges of RFC 5737.
import { and, eq, like } from "drizzle-orm";
import { afterEach, describe, expect, it, vi } from "vitest";
import { signInThrottle } from "@/db/schema";
import { PEER_HEADER } from "@/server/platform/client-address";
import { getDb } from "@/server/platform/db";
import { delaySeconds, MAX_DELAY_S } from "@/server/accounts/throttle";
import { POST as signInRoute } from "../../app/api/auth/sign-in/route";
import { forgotPasswordAction } from "../../app/(auth)/forgot-password/actions";
import { signInAction } from "../../app/(auth)/sign-in/actions";
import { submit } from "../support/action-scope";
import { call, jsonRequest } from "../support/api";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const A = { [PEER_HEADER]: "192.0.2.10" };
const B = { [PEER_HEADER]: "198.51.100.20" };
const viaApi = (email: string, password: string, client: Record<string, string>) => call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email, password }, headers: client }));
const viaForm = (email: string, password: string, client: Record<string, string>) => submit("", signInAction, { email, password }, client);
const accountFailures = (email: string) => getDb().select().from(signInThrottle).where(and(like(signInThrottle.key, `account:${email}|%`))).all().map((r) => r.failures);

afterEach(() => vi.useRealTimers());

describe("the wait", () => {
  it("is nothing for four failures, then 2, 4, 8 … seconds, at most 15 minutes", () => {
    expect([1, 2, 3, 4].map(delaySeconds)).toEqual([0, 0, 0, 0]);
    expect([5, 6, 7, 8].map(delaySeconds)).toEqual([2, 4, 8, 16]);
    expect(MAX_DELAY_S).toBe(900);
    expect(delaySeconds(40)).toBe(900);
  });
});

describe("POST /api/auth/sign-in", () => {
  it("five wrong passwords from client A: client B signs in at once, A waits and the wait grows", async () => {
    vi.useFakeTimers({ toFake: ["Date"], now: new Date("2026-11-20T09:00:00+09:00") });
    for (let i = 0; i < 5; i++) expect((await viaApi("miller@example.com", "koji-guess", A)).status).toBe(401);

    const other = await viaApi("miller@example.com", "grainline-demo", B);
    expect(other.status).toBe(200);
    expect(other.headers.get("set-cookie")).toMatch(/^grainline_session=/);

    const told = await viaApi("miller@example.com", "grainline-demo", A);
    expect(told.status).toBe(429);
    expect(told.headers.get("retry-after")).toBe("2");
    expect(told.body.error.message).toBe("Too many failed sign-in attempts from here. Wait 2 seconds and try again.");

    vi.advanceTimersByTime(2_000);
    expect((await viaApi("miller@example.com", "koji-guess", A)).status).toBe(401);
    expect((await viaApi("miller@example.com", "koji-guess", A)).headers.get("retry-after")).toBe("4");
    vi.advanceTimersByTime(4_000);
    expect((await viaApi("miller@example.com", "koji-guess", A)).status).toBe(401);
    expect((await viaApi("miller@example.com", "grainline-demo", A)).headers.get("retry-after")).toBe("8");

    // Once the wait is over the right password works from A too, and A's run is forgotten.
    vi.advanceTimersByTime(8_000);
    expect((await viaApi("miller@example.com", "grainline-demo", A)).status).toBe(200);
    expect(accountFailures("miller@example.com")).toEqual([]);
  });
});

describe("the sign-in form", () => {
  it("five wrong passwords from client A: client B signs in at once, A is told how long to wait", async () => {
    vi.useFakeTimers({ toFake: ["Date"], now: new Date("2026-11-20T10:00:00+09:00") });
    for (let i = 0; i < 5; i++) expect(await viaForm("auditor@example.com", "koji-guess", A)).toEqual({ state: expect.objectContaining({ message: "The e-mail or password is not right." }) });
    expect(await viaForm("auditor@example.com", "grainline-demo", B)).toEqual({ redirect: "/records" });
    expect(await viaForm("auditor@example.com", "grainline-demo", A)).toEqual({ state: expect.objectContaining({ message: "Too many failed attempts from here. Wait 2 seconds and try again." }) });
    vi.advanceTimersByTime(2_000);
    await viaForm("auditor@example.com", "koji-guess", A);
    expect(await viaForm("auditor@example.com", "grainline-demo", A)).toEqual({ state: expect.objectContaining({ message: "Too many failed attempts from here. Wait 4 seconds and try again." }) });
  });
});

describe("reset requests", () => {
  it("do not count as failed sign-ins", async () => {
    for (let i = 0; i < 4; i++) expect((await viaApi("sales@example.com", "koji-guess", A)).status).toBe(401);
    for (let i = 0; i < 3; i++) expect(await submit("", forgotPasswordAction, { email: "sales@example.com" }, A)).toEqual({ state: expect.objectContaining({ ok: true }) });
    expect(accountFailures("sales@example.com")).toEqual([4]);
    // The fifth failure is still a 401; only the attempt after it waits.
    expect((await viaApi("sales@example.com", "koji-guess", A)).status).toBe(401);
    expect((await viaApi("sales@example.com", "koji-guess", A)).status).toBe(429);
  });

  it("have a limit of their own: three links to one address in 15 minutes", async () => {
    const ask = () => submit("", forgotPasswordAction, { email: "grower2@example.com" }, B);
    for (let i = 0; i < 3; i++) expect(await ask()).toEqual({ state: expect.objectContaining({ ok: true }) });
    expect(await ask()).toEqual({ state: expect.objectContaining({ message: expect.stringMatching(/^Too many attempts\. Wait 15 minutes/) }) });
    expect(getDb().select().from(signInThrottle).where(eq(signInThrottle.key, "resetEmail:grower2@example.com")).get()?.failures).toBe(3);
  });
});
