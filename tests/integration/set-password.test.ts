// Set-password links (OWASP Forgot Password Cheat Sheet: tokens single-use, expiring, and the
// request rate-limited): a made-up link costs no argon2 work, a client trying links is slowed,
// and a new reset link voids the older ones.
import { desc, eq } from "drizzle-orm";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { outbox, signInThrottle } from "@/db/schema";
import { PEER_HEADER } from "@/server/platform/client-address";
import { getDb } from "@/server/platform/db";
import { hashPassword } from "@/server/accounts/passwords";
import { WINDOW_LIMITS } from "@/server/accounts/throttle";
import { forgotPasswordAction } from "../../app/(auth)/forgot-password/actions";
import { setPasswordAction } from "../../app/(auth)/set-password/[token]/actions";
import { submit } from "../support/action-scope";
import { signInAs } from "../support/api";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());
// The real hasher, counted: what matters is whether it runs at all, not how long it takes.
vi.mock("@/server/accounts/passwords", async (importOriginal) => {
  const real = await importOriginal<typeof import("@/server/accounts/passwords")>();
  return { ...real, hashPassword: vi.fn(real.hashPassword) };
});

const A = { [PEER_HEADER]: "192.0.2.31" };
const B = { [PEER_HEADER]: "198.51.100.32" };
const EXPIRED = "This link has been used or has expired.";
const setPassword = (token: string, password: string, client: Record<string, string>) => submit("", setPasswordAction, { token, password, confirm: password }, client);

async function resetLink(email: string): Promise<string> {
  expect(await submit("", forgotPasswordAction, { email }, B)).toEqual({ state: expect.objectContaining({ ok: true }) });
  const mail = getDb().select().from(outbox).orderBy(desc(outbox.createdAt)).get()!;
  expect(mail.toAddress).toBe(email);
  return /\/set-password\/([A-Za-z0-9_-]+)/.exec(mail.textBody)![1]!;
}

// Braces: a function returned from beforeEach would be run as its clean-up.
beforeEach(() => {
  vi.mocked(hashPassword).mockClear();
});

describe("set-password", () => {
  it("checks the link before hashing: a made-up or used link never reaches argon2", async () => {
    const madeUp = await setPassword("x".repeat(43), "a long new password", A);
    expect(madeUp).toEqual({ state: expect.objectContaining({ message: "Some fields need correcting.", fields: { token: [EXPIRED] } }) });
    expect(hashPassword).not.toHaveBeenCalled();

    const token = await resetLink("brewer@example.com");
    expect(await setPassword(token, "polishing to fifty", A)).toEqual({ state: expect.objectContaining({ ok: true }) });
    expect(hashPassword).toHaveBeenCalledTimes(1);
    expect(await setPassword(token, "polishing to forty", A)).toEqual({ state: expect.objectContaining({ fields: { token: [EXPIRED] } }) });
    expect(hashPassword).toHaveBeenCalledTimes(1);
    expect(await signInAs("brewer@example.com", "polishing to fifty")).toMatch(/^grainline_session=/);
  });

  it("a new reset link voids the older ones", async () => {
    const older = await resetLink("grower@example.com");
    const newer = await resetLink("grower@example.com");
    expect(await setPassword(older, "terraced paddies", B)).toEqual({ state: expect.objectContaining({ fields: { token: [EXPIRED] } }) });
    expect(await setPassword(newer, "terraced paddies", B)).toEqual({ state: expect.objectContaining({ ok: true }) });
  });

  it("is throttled per client: after ten links that do not work, that client waits; another does not", async () => {
    expect(WINDOW_LIMITS.linkClient).toBe(10);
    for (let i = 0; i < 10; i++) await setPassword(`guess-${i}-${"q".repeat(36)}`, "a long new password", A);
    const token = await resetLink("miller@example.com");
    expect(await setPassword(token, "shirotae mill stones", A)).toEqual({ state: expect.objectContaining({ message: "Too many attempts. Wait 15 minutes and try again." }) });
    expect(getDb().select().from(signInThrottle).where(eq(signInThrottle.key, `linkClient:${A[PEER_HEADER]}`)).get()?.failures).toBe(10);
    expect(await setPassword(token, "shirotae mill stones", B)).toEqual({ state: expect.objectContaining({ ok: true }) });
    expect(hashPassword).toHaveBeenCalledTimes(1);
  });
});
