// Which language the API, the language switch and the account e-mails answer in (issue 14 item 1).
// Japanese text is recognised by its Unicode blocks: Hiragana U+3040–309F, Katakana U+30A0–30FF,
// CJK Unified Ideographs U+4E00–9FFF (The Unicode Standard, chapter 18 "East Asia").
import { desc, eq } from "drizzle-orm";
import { describe, expect, it, vi } from "vitest";
import { outbox, users } from "@/db/schema";
import { translator } from "@/i18n/messages";
import { getDb } from "@/server/platform/db";
import { requestPasswordReset } from "@/server/accounts/users";
import { GET as lotRoute } from "../../app/api/lots/[code]/route";
import { POST as signInRoute } from "../../app/api/auth/sign-in/route";
import { setLanguageAction } from "../../app/(auth)/language/actions";
import { submit } from "../support/action-scope";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const JAPANESE = /[\u3040-\u30ff\u4e00-\u9fff]/;
const unauthenticated = (headers: Record<string, string>) => call(lotRoute, jsonRequest("/api/lots/P26-0001", { headers }), { code: "P26-0001" });
const localeOf = (id: string) => getDb().select({ locale: users.locale }).from(users).where(eq(users.id, id)).get()!.locale;

describe("API errors in the reader's language: cookie, then Accept-Language, then Japanese", () => {
  it("answers in Japanese with no Accept-Language at all", async () => {
    const res = await unauthenticated({ "accept-language": "" });
    expect(res.status).toBe(401);
    expect(res.body.error.message).toMatch(JAPANESE);
    expect(res.body.error.message).toBe(translator("ja")("errors.unauthenticated"));
  });

  it("answers in Japanese to ja, in English to en (the English text has no Japanese in it)", async () => {
    expect((await unauthenticated({ "accept-language": "ja-JP,ja;q=0.9" })).body.error.message).toMatch(JAPANESE);
    const en = await unauthenticated({ "accept-language": "en-US,en;q=0.9" });
    expect(en.body.error.message).toBe(translator("en")("errors.unauthenticated"));
    expect(en.body.error.message).not.toMatch(JAPANESE);
  });

  it("the language cookie wins over Accept-Language, among other cookies", async () => {
    const en = await unauthenticated({ "accept-language": "ja", cookie: "a=1; grainline-locale=en; b=2" });
    expect(en.body.error.message).toBe(translator("en")("errors.unauthenticated"));
    const ja = await unauthenticated({ "accept-language": "en", cookie: "grainline-locale=ja" });
    expect(ja.body.error.message).toBe(translator("ja")("errors.unauthenticated"));
    // A look-alike cookie name is not the language cookie.
    const other = await unauthenticated({ "accept-language": "en", cookie: "xgrainline-locale=ja" });
    expect(other.body.error.message).toBe(translator("en")("errors.unauthenticated"));
  });
});

describe("the language switch (setLanguageAction)", () => {
  it("stores the signed-in person's own setting, and only theirs", async () => {
    const cookie = await signInAs("grower@example.com");
    const before = localeOf("user-grower2");
    expect(await submit(cookie, setLanguageAction, { locale: "en" })).toEqual({ state: { ok: true } });
    expect(localeOf("user-grower")).toBe("en");
    expect(localeOf("user-grower2")).toBe(before);
    // "" goes back to following the browser.
    expect(await submit(cookie, setLanguageAction, { locale: "" })).toEqual({ state: { ok: true } });
    expect(localeOf("user-grower")).toBeNull();
  });

  it("for someone signed out changes nothing stored (the cookie alone carries the choice)", async () => {
    const before = await tableDigests();
    expect(await submit("", setLanguageAction, { locale: "ja" })).toEqual({ state: { ok: true } });
    expect(await tableDigests()).toEqual(before);
  });

  it("refuses a language the app does not have, and stores nothing", async () => {
    const cookie = await signInAs("miller@example.com");
    const before = await tableDigests(["sessions"]);
    const answer = await submit(cookie, setLanguageAction, { locale: "fr" });
    expect("state" in answer && answer.state.fields?.locale?.length).toBeGreaterThan(0);
    expect(await tableDigests(["sessions"])).toEqual(before);
  });
});

describe("signing in sets the language cookie to the person's own setting", () => {
  it("sets it when they have one, and leaves the browser's choice alone when they have none", async () => {
    getDb().update(users).set({ locale: "en" }).where(eq(users.id, "user-sales")).run();
    const withSetting = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: "sales@example.com", password: "grainline-demo" } }));
    expect(withSetting.status).toBe(200);
    expect(withSetting.headers.getSetCookie().some((c) => /^grainline-locale=en;/.test(c))).toBe(true);
    const without = await call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email: "auditor@example.com", password: "grainline-demo" } }));
    expect(without.headers.getSetCookie().some((c) => c.startsWith("grainline-locale="))).toBe(false);
  });
});

describe("account e-mails in the reader's language", () => {
  const lastMail = () => getDb().select().from(outbox).orderBy(desc(outbox.createdAt)).get()!;

  it("a reset link goes out in the person's setting, else in Japanese — whatever the requester's language", async () => {
    const english = translator("en");
    const requesterT = (key: string, values?: Record<string, unknown>) => english(key as never, values as never);
    getDb().update(users).set({ locale: "en" }).where(eq(users.id, "user-brewer")).run();
    await requestPasswordReset("brewer@example.com", "probe-1", "http://localhost:3000", requesterT);
    expect(lastMail().subject).toBe(english("mail.reset.subject"));
    await requestPasswordReset("admin@example.com", "probe-2", "http://localhost:3000", requesterT);
    expect(lastMail().subject).toBe(translator("ja")("mail.reset.subject"));
    expect(lastMail().textBody).toMatch(JAPANESE);
  });
});
